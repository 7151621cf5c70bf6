namespace Atlas.Api.Rasters;

/// <summary>
/// The coordinate axes of a regular latitude/longitude grid as the ingest stores them in <c>dataset.grid</c>
/// (<c>longitudes</c> and <c>latitudes</c> arrays, cell centres, indexed by grid_i and grid_j).
/// </summary>
public sealed record GridAxes(double[] Longitudes, double[] Latitudes)
{
    /// <summary>
    /// How far, in spacings, a coordinate may lie from its evenly spaced position and still be drawn as one pixel:
    /// 1 % of a cell is invisible on the raster, while single-precision coordinates of a fine grid (a 0.004 degree
    /// spacing at 49 N, say) miss their even positions by about 0.1 % of a spacing.
    /// </summary>
    public const double UniformTolerance = 0.01;

    /// <summary>The axes stored in a grid document, or null when it holds none (or fewer than two per axis).</summary>
    public static GridAxes? From(string gridJson)
    {
        using var document = JsonDocument.Parse(gridJson);
        var root = document.RootElement;
        if (root.ValueKind != JsonValueKind.Object) return null;
        var lon = Axis(root, "longitudes");
        var lat = Axis(root, "latitudes");
        return lon is { Length: >= 2 } && lat is { Length: >= 2 } ? new GridAxes(lon, lat) : null;
    }

    /// <summary>True when both axes are evenly spaced, so that one cell maps to one pixel.</summary>
    public bool IsUniform => Uniform(Longitudes) && Uniform(Latitudes);

    public double LongitudeSpacing => Math.Abs(Longitudes[^1] - Longitudes[0]) / (Longitudes.Length - 1);
    public double LatitudeSpacing => Math.Abs(Latitudes[^1] - Latitudes[0]) / (Latitudes.Length - 1);

    private static bool Uniform(double[] axis)
    {
        var mean = (axis[^1] - axis[0]) / (axis.Length - 1);
        if (mean == 0) return false;
        for (var k = 1; k < axis.Length - 1; k++)
            if (Math.Abs(axis[k] - (axis[0] + k * mean)) > UniformTolerance * Math.Abs(mean)) return false;
        return true;
    }

    private static double[]? Axis(JsonElement root, string name) =>
        root.TryGetProperty(name, out var axis) && axis.ValueKind == JsonValueKind.Array
            ? axis.EnumerateArray().Select(v => v.GetDouble()).ToArray()
            : null;
}
