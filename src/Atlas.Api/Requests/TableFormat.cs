namespace Atlas.Api.Requests;

/// <summary>
/// The answer forms of an endpoint that gives a table: JSON, CSV, or the CSVW metadata of that CSV
/// (<c>format=csvw</c>, the target of the CSV answer's describedby link).
/// </summary>
public enum TableFormat { Json, Csv, CsvMetadata }

public static class TableFormats
{
    /// <summary>
    /// The format named by <paramref name="text"/> (<paramref name="fallback"/> when absent), or the fallback with the
    /// fault in <paramref name="errors"/>.
    /// </summary>
    public static TableFormat Read(QueryErrors errors, string? text, string what, TableFormat fallback)
    {
        switch (text)
        {
            case null: return fallback;
            case "json": return TableFormat.Json;
            case "csv": return TableFormat.Csv;
            case CsvMetadataLinks.FormatValue: return TableFormat.CsvMetadata;
        }
        var (first, second) = fallback == TableFormat.Csv ? ("csv", "json") : ("json", "csv");
        errors.Add("format", $"'{text}' is not a {what}: use {first} or {second} ({CsvMetadataLinks.FormatValue} gives the CSV's metadata).");
        return fallback;
    }
}
