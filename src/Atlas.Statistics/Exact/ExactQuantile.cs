namespace Atlas.Statistics.Exact;

/// <summary>
/// Exact sample quantiles of a series under a stated <see cref="QuantileDefinition"/>, with the arithmetic NumPy
/// uses for the same definitions (numpy.quantile's method argument), so results agree with it to the last bit or
/// nearly so.
/// </summary>
public static class ExactQuantile
{
    /// <summary>The default definition: Hyndman-Fan type 7, NumPy's default.</summary>
    public const QuantileDefinition Default = QuantileDefinition.HyndmanFanType7;

    /// <summary>Quantile of values sorted in increasing order, without NaN.</summary>
    /// <param name="sorted">The sample, sorted ascending.</param>
    /// <param name="probability">p, 0..1.</param>
    /// <param name="definition">The definition.</param>
    /// <returns>The quantile; NaN when the sample is empty.</returns>
    public static double OfSorted(ReadOnlySpan<double> sorted, double probability, QuantileDefinition definition = Default)
    {
        if (!(probability >= 0 && probability <= 1))
            throw new ArgumentOutOfRangeException(nameof(probability), probability, "Probability must be within 0..1.");
        int n = sorted.Length;
        if (n == 0) return double.NaN;
        double p = probability;

        // Zero-based "virtual index" as in NumPy; discrete types choose an index, continuous ones interpolate.
        switch (definition)
        {
            case QuantileDefinition.HyndmanFanType1:
                return sorted[DiscreteIndex(n * p - 1, n, (gamma, _) => gamma == 0)];
            case QuantileDefinition.HyndmanFanType3:
                return sorted[DiscreteIndex(n * p - 1 - 0.5, n, (gamma, index) => gamma == 0 && Math.Floor(index) % 2 == 0)];
            case QuantileDefinition.HyndmanFanType2:
            {
                double v = n * p - 1;
                (int previous, int next) = Neighbours(v, n);
                double gamma = v - (v >= n - 1 ? -1 : v < 0 ? 0 : Math.Floor(v));
                gamma = gamma == 0 ? 0.5 : 1.0;
                return Interpolate(sorted[previous], sorted[next], gamma);
            }
            default:
            {
                double v = VirtualIndexOf(definition, n, p);
                (int previous, int next) = Neighbours(v, n);
                double floor = v >= n - 1 ? -1 : v < 0 ? 0 : Math.Floor(v);
                return Interpolate(sorted[previous], sorted[next], v - floor);
            }
        }
    }

    /// <summary>Quantile of an unsorted series; NaN values are skipped (missing steps).</summary>
    /// <returns>The quantile; NaN when no value is valid.</returns>
    public static double Of(ReadOnlySpan<double> values, double probability, QuantileDefinition definition = Default)
    {
        double[] sorted = SortedWithoutNaN(values);
        return OfSorted(sorted, probability, definition);
    }

    /// <summary>A sorted copy of the values without NaN.</summary>
    public static double[] SortedWithoutNaN(ReadOnlySpan<double> values)
    {
        int valid = 0;
        foreach (double v in values) if (!double.IsNaN(v)) valid++;
        var sorted = new double[valid];
        int i = 0;
        foreach (double v in values) if (!double.IsNaN(v)) sorted[i++] = v;
        Array.Sort(sorted);
        return sorted;
    }

    /// <summary>a + (b - a) t, computed as NumPy's quantile does (from b when t is at least 1/2).</summary>
    public static double Interpolate(double a, double b, double t)
    {
        double difference = b - a;
        return t >= 0.5 ? b - difference * (1 - t) : a + difference * t;
    }

    /// <summary>
    /// The zero-based virtual index of a definition, as NumPy computes it: types 1 and 2 n p - 1, type 3 n p - 3/2,
    /// types 4 to 9 n p + alpha + p (1 - alpha - beta) - 1 (type 7: (n - 1) p).
    /// </summary>
    internal static double VirtualIndexOf(QuantileDefinition definition, int n, double p) => definition switch
    {
        QuantileDefinition.HyndmanFanType1 or QuantileDefinition.HyndmanFanType2 => n * p - 1,
        QuantileDefinition.HyndmanFanType3 => n * p - 1.5,
        QuantileDefinition.HyndmanFanType4 => VirtualIndex(n, p, 0, 1),
        QuantileDefinition.HyndmanFanType5 => VirtualIndex(n, p, 0.5, 0.5),
        QuantileDefinition.HyndmanFanType6 => VirtualIndex(n, p, 0, 0),
        QuantileDefinition.HyndmanFanType7 => (n - 1) * p,
        QuantileDefinition.HyndmanFanType8 => VirtualIndex(n, p, 1 / 3.0, 1 / 3.0),
        QuantileDefinition.HyndmanFanType9 => VirtualIndex(n, p, 3 / 8.0, 3 / 8.0),
        _ => throw new ArgumentOutOfRangeException(nameof(definition), definition, "Unknown quantile definition."),
    };

    private static double VirtualIndex(int n, double p, double alpha, double beta) => n * p + (alpha + p * (1 - alpha - beta)) - 1;

    private static (int Previous, int Next) Neighbours(double v, int n)
    {
        if (v >= n - 1) return (n - 1, n - 1);
        if (v < 0) return (0, 0);
        int previous = (int)Math.Floor(v);
        return (previous, previous + 1);
    }

    private static int DiscreteIndex(double v, int n, Func<double, double, bool> takePrevious)
    {
        double previous = Math.Floor(v);
        double gamma = v - previous;
        double index = takePrevious(gamma, v) ? previous : previous + 1;
        return (int)Math.Clamp(index, 0, n - 1);
    }
}
