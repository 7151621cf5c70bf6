namespace Atlas.Api.Downloads;

/// <summary>
/// One column of a CSV download: the header name, a readable title, its datatype in the terms of the W3C Metadata
/// Vocabulary for Tabular Data (the XSD names: integer, double, string, boolean, dateTime), the unit (null for none)
/// and what it holds. The header row and the CSVW metadata are both written from this one description.
/// </summary>
public sealed record CsvColumn(string Name, string Title, string Datatype, string? Unit = null, string? Description = null)
{
    public static CsvColumn Integer(string name, string title, string? unit = null, string? description = null) => new(name, title, "integer", unit, description);
    public static CsvColumn Double(string name, string title, string? unit = null, string? description = null) => new(name, title, "double", unit, description);
    public static CsvColumn Text(string name, string title, string? description = null) => new(name, title, "string", null, description);
    public static CsvColumn Boolean(string name, string title, string? description = null) => new(name, title, "boolean", null, description);
    public static CsvColumn Time(string name, string title, string? description = null) => new(name, title, "dateTime", null, description ?? "UTC, ISO 8601");

    /// <summary>The cell's longitude and latitude, WGS 84 degrees (EPSG:4326).</summary>
    public static readonly CsvColumn Longitude = Double("lon", "longitude of the cell centre", "degree east", "WGS 84 (EPSG:4326)");

    /// <inheritdoc cref="Longitude"/>
    public static readonly CsvColumn Latitude = Double("lat", "latitude of the cell centre", "degree north", "WGS 84 (EPSG:4326)");

    /// <summary>The dataset's cell id.</summary>
    public static readonly CsvColumn CellId = Integer("cell_id", "cell id within the dataset");
}
