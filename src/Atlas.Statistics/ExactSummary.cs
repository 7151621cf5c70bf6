namespace Atlas.Statistics;

/// <summary>Summary statistics of a sorted sample, exactly: compensated mean, two-pass population deviation, exact percentiles.</summary>
internal static class ExactSummary
{
    private static readonly double[] Probabilities = [.. StatisticKindNames.Percentiles.Select(p => p.Probability)];

    public static SummaryStatistics Of(ReadOnlySpan<double> sorted, long expectedSteps, QuantileDefinition definition)
    {
        int n = sorted.Length;
        double coverage = expectedSteps > 0 ? (double)n / expectedSteps : 0;
        if (n == 0) return SummaryStatistics.Empty with { Coverage = coverage };
        double mean = CompensatedSum(sorted) / n;
        double squares = 0;
        foreach (double x in sorted) squares += (x - mean) * (x - mean);
        return new SummaryStatistics(mean, Math.Sqrt(squares / n), sorted[0], sorted[n - 1],
            ExactQuantile.OfSorted(sorted, Probabilities[0], definition),
            ExactQuantile.OfSorted(sorted, Probabilities[1], definition),
            ExactQuantile.OfSorted(sorted, Probabilities[2], definition),
            ExactQuantile.OfSorted(sorted, Probabilities[3], definition),
            n, coverage);
    }

    /// <summary>Number of sorted values strictly above a threshold compared in single precision, like the stored data.</summary>
    public static long CountAbove(ReadOnlySpan<double> sorted, double threshold)
    {
        double t = (float)threshold;
        int low = 0, high = sorted.Length;
        while (low < high)
        {
            int mid = (low + high) >>> 1;
            if (sorted[mid] > t) high = mid; else low = mid + 1;
        }
        return sorted.Length - low;
    }

    /// <summary>Neumaier's compensated sum.</summary>
    public static double CompensatedSum(ReadOnlySpan<double> values)
    {
        double sum = 0, compensation = 0;
        foreach (double x in values)
        {
            double t = sum + x;
            compensation += Math.Abs(sum) >= Math.Abs(x) ? (sum - t) + x : (x - t) + sum;
            sum = t;
        }
        return sum + compensation;
    }
}
