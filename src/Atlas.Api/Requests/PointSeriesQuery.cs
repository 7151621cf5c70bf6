using Microsoft.AspNetCore.Mvc;

namespace Atlas.Api.Requests;

/// <summary>The query of <c>GET /point/series</c> besides the position: the format (csv by default).</summary>
public sealed record PointSeriesQuery([property: FromQuery(Name = "format")] string? Format)
{
    /// <summary>CSV (the default), JSON, or the CSV's CSVW metadata.</summary>
    public TableFormat Form(QueryErrors errors) => TableFormats.Read(errors, Format, "series format", TableFormat.Csv);
}
