namespace Atlas.Statistics;

/// <summary>
/// Least-significant-digit radix sort of 64-bit keys by their upper 32 bits, taken as an unsigned number: the bits
/// of non-negative floats, which order like the floats themselves. Linear in the number of keys (three passes of
/// 11 bits, fewer when a digit is the same for every key), several times faster than a comparison sort on the
/// hundreds of thousands of steps of a long hourly series.
/// </summary>
internal static class ValueRadixSort
{
    private const int DigitBits = 11;
    private const int Buckets = 1 << DigitBits;

    /// <summary>Sorts <paramref name="keys"/> in place by their upper half; stable, so equal values keep their order.</summary>
    public static void SortByUpperHalf(long[] keys)
    {
        if (keys.Length < 2) return;
        var buffer = new long[keys.Length];
        var offsets = new int[Buckets];
        long[] source = keys, target = buffer;
        for (int shift = 32; shift < 64; shift += DigitBits)
        {
            Array.Clear(offsets);
            foreach (long key in source) offsets[(int)((ulong)key >> shift) & (Buckets - 1)]++;
            // A digit shared by every key (the sign and most exponent bits, often) leaves the order as it is.
            if (offsets[(int)((ulong)source[0] >> shift) & (Buckets - 1)] == source.Length) continue;
            for (int b = 0, start = 0; b < Buckets; b++)
            {
                int count = offsets[b];
                offsets[b] = start;
                start += count;
            }
            foreach (long key in source) target[offsets[(int)((ulong)key >> shift) & (Buckets - 1)]++] = key;
            (source, target) = (target, source);
        }
        if (!ReferenceEquals(source, keys)) source.CopyTo(keys, 0);
    }
}
