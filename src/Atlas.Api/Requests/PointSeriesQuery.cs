using Microsoft.AspNetCore.Mvc;

namespace Atlas.Api.Requests;

/// <summary>The query of <c>GET /point/series</c>: position, years and format (csv by default).</summary>
public sealed record PointSeriesQuery(
    [property: FromQuery(Name = "lat")] string? Lat,
    [property: FromQuery(Name = "lon")] string? Lon,
    [property: FromQuery(Name = "from")] string? From,
    [property: FromQuery(Name = "to")] string? To,
    [property: FromQuery(Name = "format")] string? Format) : IPointQuery
{
    /// <summary>True for CSV (the default), false for JSON.</summary>
    public bool Csv(QueryErrors errors) => errors.Choice("format", Format, "series format", "csv", "json") is null or "csv";
}
