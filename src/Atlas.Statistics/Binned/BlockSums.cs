using System.Runtime.CompilerServices;
using System.Runtime.Intrinsics;

namespace Atlas.Statistics.Binned;

/// <summary>
/// The fine counts of one block of bins summed over several histograms on the same bins: the view a quantile walk
/// takes of the block it is in, summed once, eight bins at a time, instead of over the parts at every bin. The sum of
/// one bin over the parts of a period fits an int: each step falls in one part.
/// </summary>
[InlineArray(FixedBinHistogram.BlockSize)]
internal struct BlockCounts
{
    private int _element;

    /// <summary>Sets the counts to those of <paramref name="block"/> summed over <paramref name="parts"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public void Load(ReadOnlySpan<FixedBinHistogram> parts, int block)
    {
        Span<int> counts = this;
        counts.Clear();
        int lanes = Vector256<int>.Count;
        foreach (FixedBinHistogram part in parts)
        {
            ReadOnlySpan<int> fine = part.Fine.AsSpan(block << FixedBinHistogram.BlockShift, FixedBinHistogram.BlockSize);
            for (int i = 0; i < FixedBinHistogram.BlockSize; i += lanes)
                (Vector256.Create(counts.Slice(i, lanes)) + Vector256.Create(fine.Slice(i, lanes))).CopyTo(counts.Slice(i, lanes));
        }
    }
}

/// <summary>
/// The weighted fine counts of one block of bins over several histograms, sum over the parts i of w_i times the count
/// of part i: each bin's terms are added in the parts' order, as a loop over the parts at that bin would add them, so
/// the masses hold the same bits.
/// </summary>
[InlineArray(FixedBinHistogram.BlockSize)]
internal struct BlockMasses
{
    private double _element;

    /// <summary>Sets the masses to those of <paramref name="block"/> over <paramref name="parts"/>, part i weighing <paramref name="weights"/>[i].</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public void Load(ReadOnlySpan<FixedBinHistogram> parts, ReadOnlySpan<double> weights, int block)
    {
        Span<double> masses = this;
        masses.Clear();
        int lanes = Vector256<int>.Count, half = Vector256<double>.Count;
        for (int p = 0; p < parts.Length; p++)
        {
            ReadOnlySpan<int> fine = parts[p].Fine.AsSpan(block << FixedBinHistogram.BlockShift, FixedBinHistogram.BlockSize);
            var weight = Vector256.Create(weights[p]);
            for (int i = 0; i < FixedBinHistogram.BlockSize; i += lanes)
            {
                var (lower, upper) = Vector256.Widen(Vector256.Create(fine.Slice(i, lanes)));
                (Vector256.Create(masses.Slice(i, half)) + weight * Vector256.ConvertToDouble(lower)).CopyTo(masses.Slice(i, half));
                (Vector256.Create(masses.Slice(i + half, half)) + weight * Vector256.ConvertToDouble(upper)).CopyTo(masses.Slice(i + half, half));
            }
        }
    }
}
