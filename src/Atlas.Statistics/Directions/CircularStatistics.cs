namespace Atlas.Statistics.Directions;

/// <summary>
/// Circular statistics of directions in degrees: (weighted) mean, mean resultant length, spread, standard
/// deviation, and compass sectors.
/// </summary>
/// <remarks>
/// A pair whose direction or weight is NaN is skipped (a missing step). Results are NaN when nothing is left or the
/// weighted unit vectors cancel exactly (no mean direction).
/// </remarks>
public static class CircularStatistics
{
    /// <summary>Direction reduced to [0, 360) degrees.</summary>
    public static double Normalise(double degrees)
    {
        double r = degrees % 360.0;
        if (r < 0) r += 360.0;
        return r >= 360.0 ? 0.0 : r;
    }

    /// <summary>Circular mean, degrees [0, 360) (as scipy.stats.circmean with high = 360).</summary>
    public static double Mean(ReadOnlySpan<double> directionsDegrees) => WeightedMean(directionsDegrees, default);

    /// <summary>Circular mean weighted by the weights (power, for wave directions), degrees [0, 360).</summary>
    /// <param name="directionsDegrees">Directions, degrees.</param>
    /// <param name="weights">Non-negative weights, one per direction; empty for equal weights.</param>
    public static double WeightedMean(ReadOnlySpan<double> directionsDegrees, ReadOnlySpan<double> weights)
    {
        var (_, c, s) = Sums(directionsDegrees, weights);
        return MeanFromSums(c, s);
    }

    /// <summary>Mean resultant length R = |sum w e^(i theta)| / sum w, 0..1.</summary>
    public static double MeanResultantLength(ReadOnlySpan<double> directionsDegrees, ReadOnlySpan<double> weights = default)
    {
        var (w, c, s) = Sums(directionsDegrees, weights);
        return w > 0 ? Math.Sqrt(c * c + s * s) / w : double.NaN;
    }

    /// <summary>Circular spread sqrt(2 (1 - R)) in degrees: the directional-spread convention of wave analysis.</summary>
    public static double Spread(ReadOnlySpan<double> directionsDegrees, ReadOnlySpan<double> weights = default)
    {
        var (w, c, s) = Sums(directionsDegrees, weights);
        return SpreadFromSums(w, c, s);
    }

    /// <summary>Circular standard deviation sqrt(-2 ln R) in degrees (as scipy.stats.circstd with high = 360).</summary>
    public static double StandardDeviation(ReadOnlySpan<double> directionsDegrees, ReadOnlySpan<double> weights = default)
    {
        double r = MeanResultantLength(directionsDegrees, weights);
        return Math.Sqrt(-2 * Math.Log(Math.Min(1, r))) * 180 / Math.PI;
    }

    /// <summary>Mean direction from summed weighted cosines and sines, degrees [0, 360); NaN when both are 0 or NaN.</summary>
    public static double MeanFromSums(double sumCos, double sumSin)
    {
        if ((sumCos == 0 && sumSin == 0) || double.IsNaN(sumCos) || double.IsNaN(sumSin)) return double.NaN;
        return Normalise(Math.Atan2(sumSin, sumCos) * 180 / Math.PI);
    }

    /// <summary>Spread sqrt(2 (1 - R)) in degrees from summed weights, cosines and sines; NaN when the weight is 0.</summary>
    public static double SpreadFromSums(double sumWeights, double sumCos, double sumSin)
    {
        if (!(sumWeights > 0)) return double.NaN;
        double r = Math.Min(1, Math.Sqrt(sumCos * sumCos + sumSin * sumSin) / sumWeights);
        return Math.Sqrt(2 * (1 - r)) * 180 / Math.PI;
    }

    /// <summary>
    /// Compass sector of a direction among <paramref name="sectors"/> equal sectors, sector 0 centred on north and
    /// numbered clockwise (for 16 sectors, sector 0 spans 348.75..11.25 degrees; a boundary belongs to the next sector clockwise).
    /// </summary>
    public static int Sector(double degrees, int sectors)
    {
        if (sectors < 1) throw new ArgumentOutOfRangeException(nameof(sectors), sectors, "At least one sector.");
        double width = 360.0 / sectors;
        int sector = (int)Math.Floor(Normalise(degrees + width / 2) / width);
        return sector >= sectors ? 0 : sector;
    }

    private static (double Weight, double Cos, double Sin) Sums(ReadOnlySpan<double> directions, ReadOnlySpan<double> weights)
    {
        if (weights.Length != 0 && weights.Length != directions.Length)
            throw new ArgumentException($"There are {directions.Length} directions but {weights.Length} weights.", nameof(weights));
        double w = 0, c = 0, s = 0;
        for (int i = 0; i < directions.Length; i++)
        {
            double weight = weights.Length == 0 ? 1 : weights[i];
            double direction = directions[i];
            if (double.IsNaN(weight) || double.IsNaN(direction)) continue;
            if (weight < 0) throw new ArgumentException($"Weight {i} is {weight}; weights must not be negative.", nameof(weights));
            var (sin, cos) = Math.SinCos(direction * Math.PI / 180);
            w += weight;
            c += weight * cos;
            s += weight * sin;
        }
        return (w, c, s);
    }
}
