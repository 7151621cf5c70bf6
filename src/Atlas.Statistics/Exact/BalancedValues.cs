using System.Buffers;

namespace Atlas.Statistics.Exact;

/// <summary>
/// The sorted values of a month-balanced period with their weights (<see cref="MonthBalance"/>): weighted mean,
/// deviation, percentiles and exceedance, exactly. Holds the cumulative weights in an array rented for the call.
/// </summary>
/// <remarks>
/// Weighted quantiles: the k-th sorted value (from 0) sits at the weighted rank r_k = (n - 1) W_k / (W - w_last),
/// W_k the weight of the values before it and W the total, so the smallest is at rank 0, the largest at rank n - 1
/// and, with equal weights, r_k = k. The chosen definition's virtual index v (NumPy's, e.g. (n - 1) p for type 7) is
/// then read on these ranks: the continuous types interpolate linearly between the two values whose ranks enclose v;
/// types 1 and 2 take the first value at or above it, type 3 the nearest. With equal weights this is the unweighted
/// definition exactly. Exceedance is the weight of the values above a threshold over the total.
/// </remarks>
internal sealed class BalancedValues : IDisposable
{
    private static readonly double[] Probabilities = [.. StatisticKindNames.Percentiles.Select(p => p.Probability)];
    private readonly ReadOnlyMemory<double> _values;
    private double[] _before;
    private readonly int _n;
    private readonly double _total, _lastWeight, _mean, _deviation;

    private ReadOnlySpan<double> Sorted => _values.Span;

    private BalancedValues(ReadOnlyMemory<double> values, ReadOnlySpan<byte> months, ReadOnlySpan<double> weights)
    {
        ReadOnlySpan<double> sorted = values.Span;
        _n = sorted.Length;
        _values = values;
        _before = ArrayPool<double>.Shared.Rent(_n);
        double total = 0, sum = 0;
        for (int k = 0; k < _n; k++)
        {
            double w = weights[months[k]];
            _before[k] = total;
            total += w;
            sum += w * sorted[k];
        }
        _total = total;
        _lastWeight = weights[months[_n - 1]];
        _mean = sum / total;
        double squares = 0;
        for (int k = 0; k < _n; k++)
        {
            double d = sorted[k] - _mean;
            squares += weights[months[k]] * d * d;
        }
        _deviation = Math.Sqrt(squares / total);
    }

    /// <summary>The balanced values of a season's or the annual run, or null when its month weights are equal (or it is empty).</summary>
    /// <param name="sorted">The run, sorted (it must outlive this object: a run of <see cref="SortedPeriodValues"/>).</param>
    public static BalancedValues? TryCreate(ReadOnlyMemory<double> sorted, ReadOnlySpan<byte> months, ReadOnlySpan<long> validByMonth, ReadOnlySpan<long> expectedByMonth)
    {
        if (sorted.IsEmpty) return null;
        Span<double> weights = stackalloc double[12];
        return MonthBalance.TryWeights(expectedByMonth, validByMonth, weights) ? new BalancedValues(sorted, months, weights) : null;
    }

    /// <summary>The summary: weighted mean and population deviation, weighted percentiles; count and coverage of the values as they are.</summary>
    public SummaryStatistics Summary(long expectedSteps, QuantileDefinition definition) =>
        new(_mean, _deviation, Sorted[0], Sorted[_n - 1],
            Quantile(Probabilities[0], definition), Quantile(Probabilities[1], definition),
            Quantile(Probabilities[2], definition), Quantile(Probabilities[3], definition),
            _n, expectedSteps > 0 ? (double)_n / expectedSteps : 0);

    /// <summary>The weighted quantile (see remarks).</summary>
    public double Quantile(double probability, QuantileDefinition definition)
    {
        if (_n == 1) return Sorted[0];
        double v = Math.Clamp(ExactQuantile.VirtualIndexOf(definition, _n, probability), 0, _n - 1);
        double scale = (_n - 1) / (_total - _lastWeight);
        // Largest k with r_k <= v (r_0 = 0 <= v always).
        double target = v / scale;
        int low = 0, high = _n - 1;
        while (low < high)
        {
            int mid = (low + high + 1) >>> 1;
            if (_before[mid] <= target) low = mid; else high = mid - 1;
        }
        int k = low;
        if (k == _n - 1) return Sorted[k];
        double rank = _before[k] * scale, next = _before[k + 1] * scale;
        switch (definition)
        {
            case QuantileDefinition.HyndmanFanType1 or QuantileDefinition.HyndmanFanType2:
                return rank >= v ? Sorted[k] : Sorted[k + 1];
            case QuantileDefinition.HyndmanFanType3:
                return v - rank <= next - v ? Sorted[k] : Sorted[k + 1];
            default:
                return ExactQuantile.Interpolate(Sorted[k], Sorted[k + 1], (v - rank) / (next - rank));
        }
    }

    /// <summary>Weighted fraction of the values strictly above a threshold compared in single precision, like the stored data.</summary>
    public double FractionAbove(double threshold)
    {
        long above = ExactSummary.CountAbove(Sorted, threshold);
        if (above == 0) return 0;
        return (_total - _before[_n - above]) / _total;
    }

    public void Dispose()
    {
        if (_before.Length > 0) ArrayPool<double>.Shared.Return(_before);
        _before = [];
    }
}
