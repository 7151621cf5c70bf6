using Atlas.Statistics;

namespace Atlas.Assessment.Validation;

/// <summary>Matched quantiles of observed and modelled values, for a quantile-quantile plot.</summary>
/// <remarks>
/// Quantiles follow <see cref="ExactQuantile"/> (Hyndman-Fan type 7, NumPy's default). Observed and
/// modelled values are sorted separately, so the pairs compare distributions, not times.
/// </remarks>
public static class QuantileComparison
{
    /// <summary>Probabilities 0.01, 0.02, ..., 0.99.</summary>
    public static IReadOnlyList<double> DefaultProbabilities { get; } = [.. Enumerable.Range(1, 99).Select(p => p / 100.0)];

    /// <summary>Quantile pairs at each probability. NaN values are skipped; with none left the quantiles are NaN.</summary>
    /// <exception cref="ArgumentOutOfRangeException">A probability is outside 0..1.</exception>
    public static IReadOnlyList<QuantilePair> Compute(ReadOnlySpan<double> observed, ReadOnlySpan<double> modelled, IReadOnlyList<double>? probabilities = null)
    {
        probabilities ??= DefaultProbabilities;
        foreach (double p in probabilities)
            ProbabilityArgument.Require(p, nameof(probabilities));
        double[] sortedObserved = ExactQuantile.SortedWithoutNaN(observed);
        double[] sortedModelled = ExactQuantile.SortedWithoutNaN(modelled);
        return [.. probabilities.Select(p => new QuantilePair(p, ExactQuantile.OfSorted(sortedObserved, p), ExactQuantile.OfSorted(sortedModelled, p)))];
    }
}
