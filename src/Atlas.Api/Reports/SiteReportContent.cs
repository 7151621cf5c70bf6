namespace Atlas.Api.Reports;

/// <summary>The nearest measuring station the dataset covers, its distance from the report's cell and its skill.</summary>
public sealed record NearestStationSkill(StationSkill Skill, double DistanceFromCellMetres, ValidationPlotSeries? HsPairs);

/// <summary>Matched Hs pairs (observed, modelled) and their quantile pairs, for the report's scatter and QQ charts.</summary>
public sealed record ValidationPlotSeries(IReadOnlyList<double> Observed, IReadOnlyList<double> Modelled,
    IReadOnlyList<double> ObservedQuantiles, IReadOnlyList<double> ModelledQuantiles);

/// <summary>
/// Everything a site report prints, each part the very record an endpoint answers for the same position and window:
/// <c>GET /point</c> (statistics), <c>/point/windows</c>, <c>/point/extremes</c>, <c>/point/yield</c> and the
/// validation of the nearest station.
/// </summary>
public sealed record SiteReportContent(
    SiteReportRequest Request,
    PointStatistics Statistics,
    PointWindows Windows,
    PointExtremes Extremes,
    PointYield? Yield,
    NearestStationSkill? Station,
    DatasetLand Land,
    (double West, double South, double East, double North) Extent,
    DateTime GeneratedAtUtc);
