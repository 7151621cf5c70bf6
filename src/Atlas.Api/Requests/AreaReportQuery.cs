using Microsoft.AspNetCore.Mvc;

namespace Atlas.Api.Requests;

/// <summary>
/// The query of <c>POST /area/report.pdf</c>: the layer and threshold of <c>POST /area</c> and the screening criteria of
/// <c>GET /screen</c>, the screening read for the layer's period.
/// </summary>
public sealed record AreaReportQuery(
    [property: FromQuery(Name = "parameter")] string? Parameter,
    [property: FromQuery(Name = "statistic")] string? Statistic,
    [property: FromQuery(Name = "period")] string? Period,
    [property: FromQuery(Name = "threshold")] string? Threshold,
    [property: FromQuery(Name = "min_power_kw_m")] string? MinPowerKwM,
    [property: FromQuery(Name = "min_depth_m")] string? MinDepthM,
    [property: FromQuery(Name = "max_depth_m")] string? MaxDepthM,
    [property: FromQuery(Name = "max_coast_distance_km")] string? MaxCoastDistanceKm,
    [property: FromQuery(Name = "max_hs_p90_m")] string? MaxHsP90M)
{
    public AreaQuery Layer => new(Parameter, Statistic, Period, Threshold);

    public ScreeningQuery Screening => new(MinPowerKwM, MinDepthM, MaxDepthM, MaxCoastDistanceKm, MaxHsP90M, Period);
}
