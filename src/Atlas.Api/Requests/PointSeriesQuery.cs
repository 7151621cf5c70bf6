using Microsoft.AspNetCore.Mvc;

namespace Atlas.Api.Requests;

/// <summary>The query of <c>GET /point/series</c> besides the position: the format (csv by default).</summary>
public sealed record PointSeriesQuery([property: FromQuery(Name = "format")] string? Format)
{
    /// <summary>True for CSV (the default), false for JSON.</summary>
    public bool Csv(QueryErrors errors) => errors.Choice("format", Format, "series format", "csv", "json") is null or "csv";
}
