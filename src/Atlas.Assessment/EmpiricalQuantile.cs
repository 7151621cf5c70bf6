using MathNet.Numerics.Statistics;

namespace Atlas.Assessment;

/// <summary>
/// Sample quantiles by linear interpolation between order statistics (Hyndman and Fan 1996
/// definition 7, NumPy's default <c>linear</c> method): for sorted x of length n, h = (n - 1) p and
/// Q(p) = x[floor h] + (h - floor h)(x[floor h + 1] - x[floor h]).
/// </summary>
public static class EmpiricalQuantile
{
    /// <summary>The quantile at <paramref name="probability"/> of the non-NaN values; NaN when there are none.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The probability is outside 0..1.</exception>
    public static double Of(ReadOnlySpan<double> values, double probability)
    {
        RequireProbability(probability);
        return OfSorted(SortedWithoutNaN(values), probability);
    }

    internal static void RequireProbability(double probability)
    {
        if (!(probability >= 0 && probability <= 1))
            throw new ArgumentOutOfRangeException(nameof(probability), probability, "A probability must lie in 0..1.");
    }

    /// <summary>Quantile of an ascending array without NaN; NaN when it is empty.</summary>
    internal static double OfSorted(double[] sorted, double probability) =>
        sorted.Length == 0 ? double.NaN : SortedArrayStatistics.QuantileCustom(sorted, probability, QuantileDefinition.R7);

    internal static double[] SortedWithoutNaN(ReadOnlySpan<double> values)
    {
        var kept = new List<double>(values.Length);
        foreach (double value in values)
            if (!double.IsNaN(value))
                kept.Add(value);
        kept.Sort();
        return [.. kept];
    }
}
