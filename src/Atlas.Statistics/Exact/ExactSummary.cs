using System.Numerics;
using System.Runtime.InteropServices;

namespace Atlas.Statistics.Exact;

/// <summary>Summary statistics of a sorted sample, exactly: mean and two-pass population deviation summed in double, exact percentiles.</summary>
internal static class ExactSummary
{
    private static readonly double[] Probabilities = [.. StatisticKindNames.Percentiles.Select(p => p.Probability)];

    public static SummaryStatistics Of(ReadOnlySpan<double> sorted, long expectedSteps, QuantileDefinition definition)
    {
        int n = sorted.Length;
        double coverage = expectedSteps > 0 ? (double)n / expectedSteps : 0;
        if (n == 0) return SummaryStatistics.Empty with { Coverage = coverage };
        double mean = Sum(sorted) / n;
        double squares = SumOfSquaredDeviations(sorted, mean);
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

    /// <summary>
    /// The sum in double, over the lanes of a SIMD vector and then across them. The values are floats (at most 24
    /// significant bits) and a series has at most millions of steps, so the rounding error, below n 2^-53 of the sum,
    /// stays many orders of magnitude under the precision of the values themselves.
    /// </summary>
    public static double Sum(ReadOnlySpan<double> values) => SumOfSquaredDeviations(values, double.NaN);

    /// <summary>The sum of (x - centre)^2, or the plain sum when <paramref name="centre"/> is NaN; vectorised as <see cref="Sum"/>.</summary>
    public static double SumOfSquaredDeviations(ReadOnlySpan<double> values, double centre)
    {
        bool plain = double.IsNaN(centre);
        var lanes = MemoryMarshal.Cast<double, Vector<double>>(values);
        var accumulator = Vector<double>.Zero;
        var shift = new Vector<double>(plain ? 0 : centre);
        foreach (Vector<double> v in lanes)
        {
            var d = v - shift;
            accumulator += plain ? v : d * d;
        }
        double sum = Vector.Sum(accumulator);
        for (int i = lanes.Length * Vector<double>.Count; i < values.Length; i++)
            sum += plain ? values[i] : (values[i] - centre) * (values[i] - centre);
        return sum;
    }
}
