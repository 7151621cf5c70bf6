namespace Atlas.Api.Layers;

/// <summary>The download formats of a layer, by file extension.</summary>
public enum LayerFormat { Tif, Csv, GeoJson, Nc, Png, Svg }

public static class LayerFormats
{
    public static readonly string[] Extensions = ["tif", "csv", "geojson", "nc", "png", "svg"];

    public static bool TryParse(string? text, out LayerFormat format)
    {
        var i = Array.FindIndex(Extensions, e => string.Equals(e, text, StringComparison.OrdinalIgnoreCase));
        format = i < 0 ? default : (LayerFormat)i;
        return i >= 0;
    }

    public static string Extension(this LayerFormat format) => Extensions[(int)format];

    public static string ContentType(this LayerFormat format) => format switch
    {
        LayerFormat.Tif => "image/tiff; application=geotiff; profile=cloud-optimized",
        LayerFormat.Csv => CsvTable.ContentType,
        LayerFormat.GeoJson => "application/geo+json",
        LayerFormat.Nc => "application/x-netcdf",
        LayerFormat.Svg => "image/svg+xml",
        _ => "image/png",
    };
}
