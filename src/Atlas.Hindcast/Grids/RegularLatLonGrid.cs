namespace Atlas.Hindcast;

/// <summary>
/// A grid with 1-D latitude and longitude axes, kept in file order: latitudes may run north to south, and a
/// longitude axis given in 0..360 is normalised into [-180, 180) value by value (so an axis crossing 180 E
/// stays in file order and is no longer monotonic).
/// </summary>
public sealed class RegularLatLonGrid : StructuredGrid
{
    public RegularLatLonGrid(double[] longitudeAxis, double[] latitudeAxis)
        : base(longitudeAxis.Length, latitudeAxis.Length, PerPoint(longitudeAxis, latitudeAxis.Length, byRow: false),
            PerPoint(latitudeAxis, longitudeAxis.Length, byRow: true))
    {
        LongitudeAxis = longitudeAxis.Select(NormaliseLongitude).ToArray();
        LatitudeAxis = latitudeAxis.ToArray();
    }

    public override GridKind Kind => GridKind.Regular;

    /// <summary>Longitude of each column, normalised into [-180, 180).</summary>
    public IReadOnlyList<double> LongitudeAxis { get; }

    /// <summary>Latitude of each row, in file order.</summary>
    public IReadOnlyList<double> LatitudeAxis { get; }

    /// <summary>True when rows run south to north.</summary>
    public bool LatitudeAscending => LatitudeAxis.Count < 2 || LatitudeAxis[1] > LatitudeAxis[0];

    // Spreads an axis over the row-major points: by row (latitude: one value per row) or by column (longitude).
    private static double[] PerPoint(double[] axis, int otherLength, bool byRow)
    {
        var result = new double[axis.Length * otherLength];
        for (int k = 0; k < result.Length; k++) result[k] = byRow ? axis[k / otherLength] : axis[k % axis.Length];
        return result;
    }
}
