namespace Atlas.Api.Downloads;

/// <summary>
/// What a GeoTIFF download says about itself: a description (TIFF ImageDescription), items for the GDAL metadata
/// XML (provenance and caution), the unit and name of the band, and the licence (TIFF Copyright).
/// </summary>
public sealed record GeoTiffMetadata(string Description, IReadOnlyList<KeyValuePair<string, string>> Items, string BandName, string Units, string? Licence);
