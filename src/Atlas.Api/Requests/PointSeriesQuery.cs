using Microsoft.AspNetCore.Mvc;

namespace Atlas.Api.Requests;

/// <summary>The query of <c>GET /point/series</c> besides the position: the format (csv by default; json, nc, or csvw for the CSV's metadata).</summary>
public sealed record PointSeriesQuery([property: FromQuery(Name = "format")] string? Format)
{
    /// <summary>CSV (the default), JSON, NetCDF (nc, CF timeSeries), or the CSV's CSVW metadata (csvw).</summary>
    public TableFormat Form(QueryErrors errors) => TableFormats.Read(errors, Format, "series format", TableFormat.Csv, netCdf: true);
}
