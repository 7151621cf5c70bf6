namespace Atlas.Api.Reports;

/// <summary>The part of an area above one threshold of its layer, as <c>POST /area?threshold=</c> answers it.</summary>
public sealed record AreaThresholdShare(double Threshold, int Cells, double AreaKm2, double ShareOfCellArea);

/// <summary>The screening criteria asked with an area report and the wet cells inside the area that meet them.</summary>
public sealed record AreaScreening(ScreeningBounds Criteria, int CellsInside, int CellsMeeting, double AreaMeetingKm2, double ShareOfCellArea);

/// <summary>
/// Everything an area report prints: the statistics <c>POST /area</c> answers for the same body and layer, the shares
/// above thresholds, the screening inside the area, and what its map draws (the layer's cells, the land, the polygon).
/// </summary>
public sealed record AreaReportContent(
    AreaStatistics Statistics,
    IReadOnlyList<AreaThresholdShare> Thresholds,
    AreaScreening Screening,
    Geometry Area,
    IReadOnlyList<(Polygon Footprint, double Value)> MapCells,
    DatasetLand Land,
    (double West, double South, double East, double North) Extent,
    (double West, double South, double East, double North) View,
    DateTime GeneratedAtUtc);
