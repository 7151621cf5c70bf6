namespace Atlas.Statistics.Binned;

/// <summary>
/// Streaming count, mean, variance, minimum and maximum in double precision, mergeable.
/// </summary>
/// <remarks>
/// Sums are kept of the values minus a shift (the first value added unless one is given), the "shifted data"
/// method: with the shift near the mean there is no cancellation in sum(d^2) - sum(d)^2 / n, and, unlike Welford's
/// update, adding a value needs no division, so the per-step cost stays at a few additions. Accumulators with the
/// same shift merge by adding their sums; with different shifts the sums are re-centred exactly first.
/// Every statistic is NaN while the count is 0. NaN values must be filtered out by the caller.
/// </remarks>
public struct RunningMoments
{
    private double _shift;
    private double _sum;
    private double _sumSquares;
    private bool _shiftSet;

    /// <summary>An empty accumulator whose sums are taken about a chosen shift (a value near the mean).</summary>
    public RunningMoments(double shift)
    {
        _shift = shift;
        _shiftSet = true;
        Minimum = double.PositiveInfinity;
        Maximum = double.NegativeInfinity;
    }

    /// <summary>Number of values added.</summary>
    public long Count { get; private set; }

    /// <summary>Smallest value; NaN when empty.</summary>
    public double Minimum { readonly get => Count == 0 ? double.NaN : field; private set; }

    /// <summary>Largest value; NaN when empty.</summary>
    public double Maximum { readonly get => Count == 0 ? double.NaN : field; private set; }

    /// <summary>Arithmetic mean; NaN when empty.</summary>
    public readonly double Mean => Count == 0 ? double.NaN : _shift + _sum / Count;

    /// <summary>Population variance (divisor n); NaN when empty.</summary>
    public readonly double PopulationVariance =>
        Count == 0 ? double.NaN : Math.Max(0, (_sumSquares - _sum * _sum / Count) / Count);

    /// <summary>Sample variance (divisor n - 1); NaN with fewer than two values.</summary>
    public readonly double SampleVariance =>
        Count < 2 ? double.NaN : Math.Max(0, (_sumSquares - _sum * _sum / Count) / (Count - 1));

    /// <summary>Population standard deviation; NaN when empty.</summary>
    public readonly double PopulationStandardDeviation => Math.Sqrt(PopulationVariance);

    /// <summary>Sample standard deviation; NaN with fewer than two values.</summary>
    public readonly double SampleStandardDeviation => Math.Sqrt(SampleVariance);

    /// <summary>Adds one value (not NaN).</summary>
    public void Add(double value)
    {
        if (!_shiftSet) Reset(value);
        if (Count == 0) { Minimum = value; Maximum = value; }
        double d = value - _shift;
        _sum += d;
        _sumSquares += d * d;
        Count++;
        if (value < Minimum) Minimum = value;
        if (value > Maximum) Maximum = value;
    }

    /// <summary>Adds sums accumulated elsewhere about this accumulator's shift (the fast path of the layer pass).</summary>
    internal void AddSums(long count, double sum, double sumSquares, double minimum, double maximum)
    {
        if (count == 0) return;
        if (Count == 0) { Minimum = minimum; Maximum = maximum; }
        Count += count;
        _sum += sum;
        _sumSquares += sumSquares;
        if (minimum < Minimum) Minimum = minimum;
        if (maximum > Maximum) Maximum = maximum;
    }

    /// <summary>Adds everything another accumulator holds.</summary>
    public void Merge(in RunningMoments other)
    {
        if (other.Count == 0) return;
        if (!_shiftSet) Reset(other._shift);
        // Re-centre the other's sums on this shift: d' = d + delta.
        double delta = other._shift - _shift;
        double sum = other._sum + other.Count * delta;
        double sumSquares = other._sumSquares + 2 * delta * other._sum + other.Count * delta * delta;
        AddSums(other.Count, sum, sumSquares, other.Minimum, other.Maximum);
    }

    private void Reset(double shift)
    {
        this = new RunningMoments(shift);
    }
}
