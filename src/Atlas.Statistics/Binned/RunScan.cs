using System.Numerics;
using System.Runtime.InteropServices;
using System.Runtime.Intrinsics;
using System.Runtime.CompilerServices;

namespace Atlas.Statistics.Binned;

/// <summary>What <see cref="RunScan.Scan"/> found in a run: the valid steps and their smallest and largest value.</summary>
/// <param name="Count">Valid steps.</param>
/// <param name="Minimum">Smallest valid value; +infinity when none.</param>
/// <param name="Maximum">Largest valid value; -infinity when none.</param>
internal readonly record struct RunExtent(int Count, float Minimum, float Maximum);

/// <summary>
/// The order-free part of reading one run of a parameter in the layer pass (consecutive steps of one slot), eight
/// steps at a time: which steps are valid, their smallest and largest value, the histogram bin of each and how many
/// exceed each threshold. The order-bound part, the running sums, is left to the caller, which adds the values'
/// offsets in step order so that the sums keep the bits of a plain loop over the run.
/// </summary>
/// <remarks>
/// Every result equals that of the plain loop step by step: a step is valid when lowest &lt;= x &lt;= float.MaxValue
/// (NaN never is); its bin is floor(x / width) in double precision, the overflow bin at and above it; it exceeds a
/// threshold when x &gt; threshold in single precision; its offset is x - shift in double precision. Counts are
/// integers and so do not depend on the order; so are the extremes, except that +0 and -0 compare equal and the plain
/// loop keeps whichever came first: a zero extreme is therefore looked up again in step order.
/// </remarks>
internal static class RunScan
{
    /// <summary>Bin written for a missing step.</summary>
    public const int MissingBin = -1;

    /// <summary>Reads one run.</summary>
    /// <param name="values">The run's values.</param>
    /// <param name="lowest">Smallest valid value.</param>
    /// <param name="shift">Subtracted from each valid value for <paramref name="offsets"/>.</param>
    /// <param name="inverseWidth">1 / bin width.</param>
    /// <param name="lastBin">The overflow bin.</param>
    /// <param name="thresholds">Exceedance thresholds, in single precision.</param>
    /// <param name="exceeding">Receives, added to what it holds, the valid steps above each threshold.</param>
    /// <param name="bins">Receives each step's bin, <see cref="MissingBin"/> for a missing step (length of the run).</param>
    /// <param name="offsets">Receives each step's value minus <paramref name="shift"/>, +0 for a missing step (length of the run).</param>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static RunExtent Scan(ReadOnlySpan<float> values, float lowest, double shift, double inverseWidth, int lastBin,
        ReadOnlySpan<float> thresholds, Span<long> exceeding, Span<int> bins, Span<double> offsets)
    {
        int n = values.Length;
        if (bins.Length < n || offsets.Length < n || exceeding.Length < thresholds.Length)
            throw new ArgumentException($"Buffers for {bins.Length} bins, {offsets.Length} offsets and {exceeding.Length} thresholds are too small for {n} steps and {thresholds.Length} thresholds.");
        int done = 0, count = 0;
        float minimum = float.PositiveInfinity, maximum = float.NegativeInfinity;
        if (Vector256.IsHardwareAccelerated && n >= Vector256<float>.Count)
            done = ScanVectors(values, lowest, shift, inverseWidth, lastBin, thresholds, exceeding, bins, offsets, ref count, ref minimum, ref maximum);
        for (int i = done; i < n; i++)
        {
            float x = values[i];
            if (!(x >= lowest && x <= float.MaxValue))
            {
                bins[i] = MissingBin;
                offsets[i] = 0;
                continue;
            }
            count++;
            if (x < minimum) minimum = x;
            if (x > maximum) maximum = x;
            double position = x * inverseWidth;
            bins[i] = position >= lastBin ? lastBin : (int)position;
            offsets[i] = x - shift;
            for (int t = 0; t < thresholds.Length; t++)
                if (x > thresholds[t]) exceeding[t]++;
        }
        // +0 and -0 are equal: the plain loop keeps the first of them, so a zero extreme is found again in step order.
        if (minimum == 0) minimum = FirstExtreme(values, lowest, smallest: true);
        if (maximum == 0) maximum = FirstExtreme(values, lowest, smallest: false);
        return new RunExtent(count, minimum, maximum);
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static int ScanVectors(ReadOnlySpan<float> values, float lowest, double shift, double inverseWidth, int lastBin,
        ReadOnlySpan<float> thresholds, Span<long> exceeding, Span<int> bins, Span<double> offsets, ref int count, ref float minimum, ref float maximum)
    {
        int lanes = Vector256<float>.Count;
        var low = Vector256.Create(lowest);
        var high = Vector256.Create(float.MaxValue);
        var shifts = Vector256.Create(shift);
        var inverse = Vector256.Create(inverseWidth);
        var overflow = Vector256.Create((double)lastBin);
        var missing = Vector256.Create(MissingBin);
        var smallest = Vector256.Create(float.PositiveInfinity);
        var largest = Vector256.Create(float.NegativeInfinity);
        ref float source = ref MemoryMarshal.GetReference(values);
        ref int binOut = ref MemoryMarshal.GetReference(bins);
        ref double offsetOut = ref MemoryMarshal.GetReference(offsets);
        int valid = 0, i = 0;
        for (; i + lanes <= values.Length; i += lanes)
        {
            var x = Vector256.LoadUnsafe(ref source, (nuint)i);
            var mask = Vector256.GreaterThanOrEqual(x, low) & Vector256.LessThanOrEqual(x, high);
            valid += BitOperations.PopCount(mask.ExtractMostSignificantBits());
            smallest = Vector256.ConditionalSelect(mask & Vector256.LessThan(x, smallest), x, smallest);
            largest = Vector256.ConditionalSelect(mask & Vector256.GreaterThan(x, largest), x, largest);
            var (lower, upper) = Vector256.Widen(x);
            var (maskLower, maskUpper) = Vector256.Widen(mask.AsInt32());
            Vector256.ConditionalSelect(maskLower.AsDouble(), lower - shifts, Vector256<double>.Zero).StoreUnsafe(ref offsetOut, (nuint)i);
            Vector256.ConditionalSelect(maskUpper.AsDouble(), upper - shifts, Vector256<double>.Zero).StoreUnsafe(ref offsetOut, (nuint)(i + lanes / 2));
            var bin = Vector256.Narrow(Bins(lower, inverse, overflow), Bins(upper, inverse, overflow));
            Vector256.ConditionalSelect(mask.AsInt32(), bin, missing).StoreUnsafe(ref binOut, (nuint)i);
        }
        count += valid;
        for (int l = 0; l < lanes; l++)
        {
            if (smallest[l] < minimum) minimum = smallest[l];
            if (largest[l] > maximum) maximum = largest[l];
        }
        // One threshold at a time, so that its count stays in a register.
        for (int t = 0; t < thresholds.Length; t++)
        {
            var threshold = Vector256.Create(thresholds[t]);
            var above = Vector256<int>.Zero;
            for (int j = 0; j < i; j += lanes)
            {
                var x = Vector256.LoadUnsafe(ref source, (nuint)j);
                var mask = Vector256.GreaterThanOrEqual(x, low) & Vector256.LessThanOrEqual(x, high);
                above -= (Vector256.GreaterThan(x, threshold) & mask).AsInt32();
            }
            exceeding[t] += Vector256.Sum(above);
        }
        return i;
    }

    /// <summary>floor(x / width) as the plain loop takes it: x times the inverse width in double, the overflow bin at and above it.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static Vector256<long> Bins(Vector256<double> x, Vector256<double> inverse, Vector256<double> overflow)
    {
        var position = x * inverse;
        // Positions at or above the overflow bin are clamped first, so that the conversion only ever truncates a value in
        // range; a lane that is not a number is a missing step, whose bin the caller replaces.
        return Vector256.ConvertToInt64Native(Vector256.ConditionalSelect(Vector256.GreaterThanOrEqual(position, overflow), overflow, position));
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static float FirstExtreme(ReadOnlySpan<float> values, float lowest, bool smallest)
    {
        float extreme = smallest ? float.PositiveInfinity : float.NegativeInfinity;
        foreach (float x in values)
        {
            if (!(x >= lowest && x <= float.MaxValue)) continue;
            if (smallest ? x < extreme : x > extreme) extreme = x;
        }
        return extreme;
    }
}
