namespace Atlas.Api.Requests;

/// <summary>
/// The answer forms of an endpoint that gives a table: JSON, CSV, the CSVW metadata of that CSV (<c>format=csvw</c>,
/// the target of the CSV answer's describedby link), and for a time series also CF NetCDF (<c>format=nc</c>).
/// </summary>
public enum TableFormat { Json, Csv, CsvMetadata, NetCdf }

public static class TableFormats
{
    /// <summary>
    /// The format named by <paramref name="text"/> (<paramref name="fallback"/> when absent), or the fallback with the
    /// fault in <paramref name="errors"/>. NetCDF (<c>nc</c>) is a choice only where <paramref name="netCdf"/> is true.
    /// </summary>
    public static TableFormat Read(QueryErrors errors, string? text, string what, TableFormat fallback, bool netCdf = false)
    {
        switch (text)
        {
            case null: return fallback;
            case "json": return TableFormat.Json;
            case "csv": return TableFormat.Csv;
            case CsvMetadataLinks.FormatValue: return TableFormat.CsvMetadata;
            case "nc" when netCdf: return TableFormat.NetCdf;
        }
        var (first, second) = fallback == TableFormat.Csv ? ("csv", "json") : ("json", "csv");
        var choices = netCdf ? $"{first}, {second} or nc" : $"{first} or {second}";
        errors.Add("format", $"'{text}' is not a {what}: use {choices} ({CsvMetadataLinks.FormatValue} gives the CSV's metadata).");
        return fallback;
    }
}
