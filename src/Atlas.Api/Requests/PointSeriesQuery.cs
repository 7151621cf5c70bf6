using Microsoft.AspNetCore.Mvc;

namespace Atlas.Api.Requests;

/// <summary>The query of <c>GET /point/series</c> besides the position: the format (csv by default).</summary>
public sealed record PointSeriesQuery([property: FromQuery(Name = "format")] string? Format)
{
    /// <summary>The format asked for: csv (the default), json or nc (CF NetCDF timeSeries).</summary>
    public string Chosen(QueryErrors errors) => errors.Choice("format", Format, "series format", "csv", "json", "nc") ?? "csv";
}
