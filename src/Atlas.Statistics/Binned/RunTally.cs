using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;

namespace Atlas.Statistics.Binned;

/// <summary>
/// The order-bound part of reading runs in the layer pass (after <see cref="RunScan"/>): per run, the sum and the sum
/// of squares of the offsets in step order, and a count in the histogram bin of every valid step, four runs side by
/// side. Each run's sums are its own chain of additions in its own order, so they hold the same bits as a loop over
/// that run alone; the four chains (and the four runs' counts, which go to different histograms) overlap in the
/// processor instead of each waiting on the last addition.
/// </summary>
internal static class RunTally
{
    /// <summary>Runs read side by side.</summary>
    public const int Lanes = 4;

    /// <summary>
    /// Tallies <see cref="Lanes"/> runs laid out lane after lane, <paramref name="stride"/> steps each: a run shorter than
    /// the stride is padded with offset +0 and <see cref="RunScan.MissingBin"/>, which leave its sums and counts as they
    /// are (a sum begun at +0 is never -0, and x + 0 = x for every other x).
    /// </summary>
    /// <param name="offsets">Per lane, the steps' offsets (<see cref="RunScan.Scan"/>).</param>
    /// <param name="bins">Per lane, the steps' bins, <see cref="RunScan.MissingBin"/> for a missing step.</param>
    /// <param name="stride">Steps per lane.</param>
    /// <param name="fine">Per lane, the fine counts that receive the lane's steps.</param>
    /// <param name="alsoFine">Per lane, a second set of fine counts that receives them too (the year's), or null.</param>
    /// <param name="sums">Receives per lane the sum and then the sum of squares (2 x <see cref="Lanes"/> values).</param>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static void Tally(ReadOnlySpan<double> offsets, ReadOnlySpan<int> bins, int stride, ReadOnlySpan<int[]> fine,
        ReadOnlySpan<int[]?> alsoFine, Span<double> sums)
    {
        if (offsets.Length < Lanes * stride || bins.Length < Lanes * stride || fine.Length < Lanes || alsoFine.Length < Lanes || sums.Length < 2 * Lanes)
            throw new ArgumentException($"Tallying {Lanes} runs of {stride} steps needs {Lanes * stride} offsets and bins, {Lanes} histograms and {2 * Lanes} sums.");
        int[] f0 = fine[0], f1 = fine[1], f2 = fine[2], f3 = fine[3];
        int[]? y0 = alsoFine[0], y1 = alsoFine[1], y2 = alsoFine[2], y3 = alsoFine[3];
        bool both = y0 is not null && y1 is not null && y2 is not null && y3 is not null;
        ref double o = ref MemoryMarshal.GetReference(offsets);
        ref int b = ref MemoryMarshal.GetReference(bins);
        double s0 = 0, s1 = 0, s2 = 0, s3 = 0, q0 = 0, q1 = 0, q2 = 0, q3 = 0;
        for (int i = 0; i < stride; i++)
        {
            double d0 = Unsafe.Add(ref o, i), d1 = Unsafe.Add(ref o, stride + i), d2 = Unsafe.Add(ref o, 2 * stride + i), d3 = Unsafe.Add(ref o, 3 * stride + i);
            s0 += d0;
            q0 += d0 * d0;
            s1 += d1;
            q1 += d1 * d1;
            s2 += d2;
            q2 += d2 * d2;
            s3 += d3;
            q3 += d3 * d3;
            int b0 = Unsafe.Add(ref b, i), b1 = Unsafe.Add(ref b, stride + i), b2 = Unsafe.Add(ref b, 2 * stride + i), b3 = Unsafe.Add(ref b, 3 * stride + i);
            if (b0 != RunScan.MissingBin) f0[b0]++;
            if (b1 != RunScan.MissingBin) f1[b1]++;
            if (b2 != RunScan.MissingBin) f2[b2]++;
            if (b3 != RunScan.MissingBin) f3[b3]++;
            if (!both) continue;
            if (b0 != RunScan.MissingBin) y0![b0]++;
            if (b1 != RunScan.MissingBin) y1![b1]++;
            if (b2 != RunScan.MissingBin) y2![b2]++;
            if (b3 != RunScan.MissingBin) y3![b3]++;
        }
        sums[0] = s0;
        sums[1] = q0;
        sums[2] = s1;
        sums[3] = q1;
        sums[4] = s2;
        sums[5] = q2;
        sums[6] = s3;
        sums[7] = q3;
    }
}
