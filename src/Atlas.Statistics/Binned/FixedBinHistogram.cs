using System.Runtime.Intrinsics;
using System.Runtime.CompilerServices;

namespace Atlas.Statistics.Binned;

/// <summary>
/// A histogram of non-negative values on fixed bins (<see cref="HistogramBinning"/>), two-level so that percentiles
/// are cheap: fine bins are grouped in blocks of <see cref="BlockSize"/> with a count per block, and a quantile walk
/// skips whole blocks. Several histograms (the months of a season, say) can be read as one without merging them.
/// </summary>
/// <remarks>
/// Quantiles follow Hyndman and Fan's type 7 (NumPy's default): the order statistics at ranks floor(h) and
/// floor(h) + 1, h = (n - 1) p, interpolated linearly. Each order statistic is estimated by spreading its bin's
/// count evenly across the bin and clamped to the recorded minimum and maximum, so below the upper bound the
/// estimate is within one bin width of the exact quantile. A quantile in the overflow bin (at and above the upper
/// bound, which the default bounds put beyond any physical value) is only known to lie between the bound and the
/// maximum; the maximum itself is exact. Clearing touches only the blocks that were used.
/// </remarks>
public sealed class FixedBinHistogram
{
    /// <summary>log2 of <see cref="BlockSize"/>.</summary>
    public const int BlockShift = 6;

    /// <summary>Fine bins per block.</summary>
    public const int BlockSize = 1 << BlockShift;

    internal readonly int[] Fine;
    internal readonly int[] Coarse;
    internal readonly int LastBin;
    internal readonly double InverseWidth;
    internal int LowBlock = int.MaxValue;
    internal int HighBlock = -1;

    /// <summary>An empty histogram on the given bins.</summary>
    public FixedBinHistogram(HistogramBinning binning)
    {
        ArgumentNullException.ThrowIfNull(binning);
        binning.Validate(nameof(binning));
        Binning = binning;
        LastBin = binning.EqualBinCount;
        InverseWidth = 1.0 / binning.BinWidth;
        Fine = new int[(LastBin >> BlockShift) + 1 << BlockShift];
        Coarse = new int[(LastBin >> BlockShift) + 1];
    }

    /// <summary>The bins.</summary>
    public HistogramBinning Binning { get; }

    /// <summary>Number of values added.</summary>
    public long Count { get; private set; }

    /// <summary>Smallest value added; +infinity when empty.</summary>
    public double Minimum { get; private set; } = double.PositiveInfinity;

    /// <summary>Largest value added; -infinity when empty.</summary>
    public double Maximum { get; private set; } = double.NegativeInfinity;

    /// <summary>The bin of a value: floor(value / width), or the overflow bin at and above the upper bound.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The value is negative or NaN.</exception>
    public int BinOf(double value)
    {
        if (!(value >= 0)) throw new ArgumentOutOfRangeException(nameof(value), value, "Histogram values must not be negative or NaN.");
        double position = value * InverseWidth;
        return position >= LastBin ? LastBin : (int)position;
    }

    /// <summary>Adds one value.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The value is negative or NaN.</exception>
    public void Add(double value)
    {
        int bin = BinOf(value);
        Fine[bin]++;
        Coarse[bin >> BlockShift]++;
        Record(1, value, value, bin, bin);
    }

    /// <summary>Bookkeeping after the caller incremented bins lowBin..highBin directly (the fast path of the layer pass).</summary>
    internal void Record(long count, double minimum, double maximum, int lowBin, int highBin)
    {
        if (count == 0) return;
        Count += count;
        if (minimum < Minimum) Minimum = minimum;
        if (maximum > Maximum) Maximum = maximum;
        int low = lowBin >> BlockShift, high = highBin >> BlockShift;
        if (low < LowBlock) LowBlock = low;
        if (high > HighBlock) HighBlock = high;
    }

    /// <summary>
    /// Sets the block counts from the fine counts over the blocks in use, after the caller incremented only fine bins
    /// (the fast path of the layer pass: one count per value instead of two).
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    internal void CountBlocks()
    {
        for (int b = LowBlock; b <= HighBlock; b++)
        {
            ReadOnlySpan<int> block = Fine.AsSpan(b << BlockShift, BlockSize);
            var sum = Vector256<int>.Zero;
            for (int i = 0; i < BlockSize; i += Vector256<int>.Count)
                sum += Vector256.Create(block.Slice(i, Vector256<int>.Count));
            Coarse[b] = Vector256.Sum(sum);
        }
    }

    /// <summary>Bins of the smallest and largest value, for <see cref="Record"/>.</summary>
    internal int BinOfValid(double value)
    {
        double position = value * InverseWidth;
        return position >= LastBin ? LastBin : (int)position;
    }

    /// <summary>Empties the histogram, touching only the blocks used.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public void Clear()
    {
        for (int b = LowBlock; b <= HighBlock; b++)
        {
            if (Coarse[b] == 0) continue;
            Array.Clear(Fine, b << BlockShift, BlockSize);
            Coarse[b] = 0;
        }
        LowBlock = int.MaxValue;
        HighBlock = -1;
        Count = 0;
        Minimum = double.PositiveInfinity;
        Maximum = double.NegativeInfinity;
    }

    /// <summary>Estimated type-7 quantile; NaN when empty.</summary>
    public double EstimateQuantile(double probability)
    {
        Span<double> result = stackalloc double[1];
        EstimateQuantiles([this], [probability], result);
        return result[0];
    }

    /// <summary>
    /// Estimated type-7 quantiles of several histograms on the same bins read as one, for probabilities given in
    /// increasing order; NaN when they hold no value.
    /// </summary>
    /// <exception cref="ArgumentException">The parts have different bins, or the probabilities are not increasing within 0..1.</exception>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static void EstimateQuantiles(ReadOnlySpan<FixedBinHistogram> parts, ReadOnlySpan<double> probabilities, Span<double> results)
    {
        if (results.Length < probabilities.Length)
            throw new ArgumentException($"{results.Length} results for {probabilities.Length} probabilities.", nameof(results));
        for (int q = 0; q < probabilities.Length; q++)
        {
            if (!(probabilities[q] >= 0 && probabilities[q] <= 1) || (q > 0 && probabilities[q] < probabilities[q - 1]))
                throw new ArgumentException($"Probability {q} is {probabilities[q]}; probabilities must increase within 0..1.", nameof(probabilities));
        }
        long n = 0;
        double minimum = double.PositiveInfinity, maximum = double.NegativeInfinity;
        int lowBlock = int.MaxValue;
        foreach (FixedBinHistogram part in parts)
        {
            if (!ReferenceEquals(part.Binning, parts[0].Binning) && part.Binning != parts[0].Binning)
                throw new ArgumentException("Histograms read together must share their bins.", nameof(parts));
            n += part.Count;
            if (part.Count == 0) continue;
            minimum = Math.Min(minimum, part.Minimum);
            maximum = Math.Max(maximum, part.Maximum);
            lowBlock = Math.Min(lowBlock, part.LowBlock);
        }
        if (n == 0)
        {
            results[..probabilities.Length].Fill(double.NaN);
            return;
        }

        var walk = new OrderStatisticWalk(parts, lowBlock, n, minimum, maximum);
        for (int q = 0; q < probabilities.Length; q++)
        {
            double h = (n - 1) * probabilities[q];
            long k = (long)Math.Floor(h);
            double lower = walk.Estimate(k);
            double upper = k + 1 < n ? walk.Estimate(k + 1) : lower;
            results[q] = ExactQuantile.Interpolate(lower, upper, h - k);
        }
    }

    /// <summary>
    /// Estimated quantiles of several histograms on the same bins read as one, each value of part i weighing
    /// <paramref name="weights"/>[i] (the month-balanced climatology), as the weighted type-7 quantile of
    /// <see cref="MethodNotes.WeightedPercentiles"/>: the weighted rank p (W - w) is sought, W the total weight and w
    /// the weight of the largest value, so that equal weights give the order statistics at (n - 1) p of
    /// <see cref="EstimateQuantiles"/>. Inside a bin its values are taken as evenly spread across it, each carrying the
    /// bin's mean weight; the two values whose weighted ranks enclose the sought one are estimated so and interpolated,
    /// and clamped to the recorded minimum and maximum (p = 0 and p = 1 give them exactly). Probabilities must
    /// increase; NaN when the parts hold no weighted value.
    /// </summary>
    /// <exception cref="ArgumentException">The parts have different bins, a weight is negative, or the probabilities are not increasing within 0..1.</exception>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static void EstimateWeightedQuantiles(ReadOnlySpan<FixedBinHistogram> parts, ReadOnlySpan<double> weights,
        ReadOnlySpan<double> probabilities, Span<double> results)
    {
        if (weights.Length < parts.Length) throw new ArgumentException($"{weights.Length} weights for {parts.Length} histograms.", nameof(weights));
        if (results.Length < probabilities.Length)
            throw new ArgumentException($"{results.Length} results for {probabilities.Length} probabilities.", nameof(results));
        double total = 0, minimum = double.PositiveInfinity, maximum = double.NegativeInfinity, lastWeight = 0;
        long count = 0;
        int lowBlock = int.MaxValue, highBlock = -1;
        for (int i = 0; i < parts.Length; i++)
        {
            FixedBinHistogram part = parts[i];
            if (!ReferenceEquals(part.Binning, parts[0].Binning) && part.Binning != parts[0].Binning)
                throw new ArgumentException("Histograms read together must share their bins.", nameof(parts));
            if (!(weights[i] >= 0) || double.IsInfinity(weights[i]))
                throw new ArgumentException($"Weight {i} is {weights[i]}; weights must be finite and not negative.", nameof(weights));
            if (part.Count == 0 || weights[i] == 0) continue;
            total += weights[i] * part.Count;
            count += part.Count;
            minimum = Math.Min(minimum, part.Minimum);
            if (part.Maximum > maximum) { maximum = part.Maximum; lastWeight = weights[i]; }
            lowBlock = Math.Min(lowBlock, part.LowBlock);
            highBlock = Math.Max(highBlock, part.HighBlock);
        }
        for (int q = 0; q < probabilities.Length; q++)
        {
            if (!(probabilities[q] >= 0 && probabilities[q] <= 1) || (q > 0 && probabilities[q] < probabilities[q - 1]))
                throw new ArgumentException($"Probability {q} is {probabilities[q]}; probabilities must increase within 0..1.", nameof(probabilities));
        }
        if (!(total > 0))
        {
            results[..probabilities.Length].Fill(double.NaN);
            return;
        }

        var walk = new WeightedBinWalk(parts, weights, lowBlock, highBlock);
        for (int q = 0; q < probabilities.Length; q++)
        {
            double p = probabilities[q];
            if (p == 0) { results[q] = minimum; continue; }
            if (p == 1 || count == 1) { results[q] = maximum; continue; }
            // The weighted rank sought, in units of weight before the value.
            double target = p * (total - lastWeight);
            (double lower, double fraction) = walk.Estimate(target);
            double upper = walk.EstimateNext();
            results[q] = Math.Clamp(ExactQuantile.Interpolate(lower, upper, fraction), minimum, maximum);
        }
    }
}
