namespace Atlas.Statistics.Exact;

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
    private const int Digits = 3; // bits 32..42, 43..53 and 54..63

    /// <summary>
    /// Sorts <paramref name="keys"/> in place by their upper half; stable, so equal values keep their order.
    /// <paramref name="buffer"/> (at least as long as the keys) is scratch space; its contents are overwritten.
    /// </summary>
    public static void SortByUpperHalf(Span<long> keys, Span<long> buffer)
    {
        if (keys.Length < 2) return;
        if (buffer.Length < keys.Length) throw new ArgumentException($"The buffer holds {buffer.Length} keys; {keys.Length} are sorted.", nameof(buffer));
        // The counts of every digit in one read of the keys: counting does not depend on the order the passes leave.
        var offsets = new int[Digits * Buckets];
        foreach (long key in keys)
        {
            ulong bits = (ulong)key;
            offsets[(int)(bits >> 32) & (Buckets - 1)]++;
            offsets[Buckets + ((int)(bits >> (32 + DigitBits)) & (Buckets - 1))]++;
            offsets[2 * Buckets + ((int)(bits >> (32 + 2 * DigitBits)) & (Buckets - 1))]++;
        }
        Span<long> source = keys, target = buffer[..keys.Length];
        bool inBuffer = false;
        for (int digit = 0; digit < Digits; digit++)
        {
            int shift = 32 + digit * DigitBits;
            Span<int> start = offsets.AsSpan(digit * Buckets, Buckets);
            // A digit shared by every key (the sign and most exponent bits, often) leaves the order as it is.
            if (start[(int)((ulong)source[0] >> shift) & (Buckets - 1)] == source.Length) continue;
            for (int b = 0, next = 0; b < Buckets; b++)
            {
                int count = start[b];
                start[b] = next;
                next += count;
            }
            foreach (long key in source) target[start[(int)((ulong)key >> shift) & (Buckets - 1)]++] = key;
            Span<long> sorted = target;
            target = source;
            source = sorted;
            inBuffer = !inBuffer;
        }
        if (inBuffer) source.CopyTo(keys);
    }
}
