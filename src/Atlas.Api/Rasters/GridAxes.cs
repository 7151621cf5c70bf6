using System.Text.Json;

namespace Atlas.Api.Rasters;

/// <summary>
/// The coordinate axes of a regular latitude/longitude grid as the ingest stores them in <c>dataset.grid</c>
/// (<c>longitudes</c> and <c>latitudes</c> arrays, cell centres, indexed by grid_i and grid_j).
/// </summary>
public sealed record GridAxes(double[] Longitudes, double[] Latitudes)
{
    /// <summary>Relative tolerance within which an axis counts as evenly spaced.</summary>
    public const double UniformTolerance = 1e-4;

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
        for (var k = 1; k < axis.Length; k++)
            if (Math.Abs(axis[k] - axis[k - 1] - mean) > UniformTolerance * Math.Abs(mean)) return false;
        return true;
    }

    private static double[]? Axis(JsonElement root, string name) =>
        root.TryGetProperty(name, out var axis) && axis.ValueKind == JsonValueKind.Array
            ? axis.EnumerateArray().Select(v => v.GetDouble()).ToArray()
            : null;
}
