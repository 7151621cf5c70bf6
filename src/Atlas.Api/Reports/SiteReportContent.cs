namespace Atlas.Api.Reports;

/// <summary>The nearest measuring station the dataset covers, its distance from the report's cell and its skill.</summary>
public sealed record NearestStationSkill(StationSkill Skill, double DistanceFromCellMetres, ValidationPlotSeries? HsPairs);

/// <summary>Matched Hs pairs (times in Unix seconds, observed, modelled) and their quantile pairs, for the report's time series, scatter and QQ charts.</summary>
public sealed record ValidationPlotSeries(IReadOnlyList<long> Times, IReadOnlyList<double> Observed, IReadOnlyList<double> Modelled,
    IReadOnlyList<double> ObservedQuantiles, IReadOnlyList<double> ModelledQuantiles);

/// <summary>The cell's Hs and wave power per step (Unix seconds; NaN where missing), as <c>GET /point/series</c> gives them.</summary>
public sealed record PointTimeSeries(IReadOnlyList<long> Times, IReadOnlyList<double> Hs, IReadOnlyList<double> PowerKilowattsPerMetre);

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
    PointTimeSeries Series,
    NearestStationSkill? Station,
    DatasetLand Land,
    (double West, double South, double East, double North) Extent,
    DateTime GeneratedAtUtc);
