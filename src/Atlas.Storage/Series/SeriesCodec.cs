using System.Runtime.InteropServices;
using System.Runtime.Intrinsics;
using System.Buffers.Binary;
using System.Runtime.CompilerServices;

namespace Atlas.Storage.Series;

/// <summary>
/// Packs one cell-year of series into 16 bits per value. Each variable is rounded to a fixed step and stored as an
/// unsigned little-endian 16-bit integer, 0xFFFF meaning missing:
/// Hs 1 mm (0 to 65.534 m, error at most 0.5 mm); Te and Tp 0.01 s (to 655.34 s, error at most 0.005 s);
/// direction 0.01 degree (0 to 359.99, error at most 0.005 degree); directional spread 0.01 degree.
/// Layout: version byte, variable mask byte (bit n = slot n: Hs 0, Te 1, Tp 2, Dir 3, Spread 4, the order of
/// <see cref="WaveParameterGroups.SeriesFields"/>), step count (int32), then the present variables in slot order, each a
/// run of step-count values. The slots are this format's own numbers and never leave Storage (see <see cref="SlotOf"/>). 2 bytes per stored value plus a 6-byte header.
/// </summary>
public static class SeriesCodec
{
    public const byte FormatVersion = 1;
    public const ushort Missing = 0xFFFF;
    public const int HeaderBytes = 6;
    public const int VariableCount = 5;

    private static readonly double[] Steps = [0.001, 0.01, 0.01, 0.01, 0.01];

    /// <summary>The slot of a series field in the payload; anything but Hs, Te, Tp, Dir and Spread is not stored here.</summary>
    internal static int SlotOf(WaveParameter variable) => variable switch
    {
        WaveParameter.Hs => 0,
        WaveParameter.Te => 1,
        WaveParameter.Tp => 2,
        WaveParameter.Dir => 3,
        WaveParameter.Spread => 4,
        _ => throw new ArgumentOutOfRangeException(nameof(variable), variable, $"'{variable.Symbol()}' is not a stored series field."),
    };

    /// <summary>The bit of a series field in a payload's variable mask.</summary>
    public static int BitOf(WaveParameter variable) => 1 << SlotOf(variable);

    /// <summary>The quantisation step of a variable, in its SI unit.</summary>
    public static double StepOf(WaveParameter variable) => Steps[SlotOf(variable)];

    /// <summary>The largest value a variable can hold.</summary>
    public static double MaximumOf(WaveParameter variable) => (Missing - 1) * Steps[SlotOf(variable)];

    public static int EncodedLength(int stepCount, int variableCount) => HeaderBytes + 2 * stepCount * variableCount;

    /// <summary>
    /// Encodes the given variables (null or empty = absent). Every present span must have <paramref name="stepCount"/>
    /// values; NaN is missing. Throws <see cref="ArgumentOutOfRangeException"/> naming the variable for a value below
    /// zero or above the range (direction is wrapped into 0..360 first).
    /// </summary>
    public static byte[] Encode(int stepCount, ReadOnlySpan<float> hs, ReadOnlySpan<float> te, ReadOnlySpan<float> tp,
        ReadOnlySpan<float> dir, ReadOnlySpan<float> spread)
    {
        int mask = 0, count = 0;
        if (!hs.IsEmpty) { mask |= 1; count++; }
        if (!te.IsEmpty) { mask |= 2; count++; }
        if (!tp.IsEmpty) { mask |= 4; count++; }
        if (!dir.IsEmpty) { mask |= 8; count++; }
        if (!spread.IsEmpty) { mask |= 16; count++; }
        var buffer = new byte[EncodedLength(stepCount, count)];
        buffer[0] = FormatVersion;
        buffer[1] = (byte)mask;
        BinaryPrimitives.WriteInt32LittleEndian(buffer.AsSpan(2), stepCount);
        var offset = HeaderBytes;
        offset = Append(hs, WaveParameter.Hs, stepCount, buffer, offset);
        offset = Append(te, WaveParameter.Te, stepCount, buffer, offset);
        offset = Append(tp, WaveParameter.Tp, stepCount, buffer, offset);
        offset = Append(dir, WaveParameter.Dir, stepCount, buffer, offset);
        Append(spread, WaveParameter.Spread, stepCount, buffer, offset);
        return buffer;
    }

    private static int Append(ReadOnlySpan<float> values, WaveParameter variable, int stepCount, byte[] buffer, int offset)
    {
        if (values.IsEmpty) return offset;
        if (values.Length != stepCount)
            throw new ArgumentException($"{variable} has {values.Length} values, expected {stepCount}.");
        Quantise(values, variable, buffer.AsSpan(offset, 2 * stepCount));
        return offset + 2 * stepCount;
    }

    private static void Quantise(ReadOnlySpan<float> values, WaveParameter variable, Span<byte> destination)
    {
        var quantiser = new SeriesQuantiser(variable);
        for (var i = 0; i < values.Length; i++)
        {
            var q = quantiser.Quantise(values[i]);
            if (q == SeriesQuantiser.OutOfRange) throw OutOfRange(variable, values[i]);
            BinaryPrimitives.WriteUInt16LittleEndian(destination.Slice(2 * i), (ushort)q);
        }
    }

    /// <summary>A payload of <paramref name="stepCount"/> steps holding the variables of <paramref name="mask"/>, all missing.</summary>
    public static byte[] CreateEmpty(int stepCount, int mask)
    {
        var buffer = new byte[EncodedLength(stepCount, System.Numerics.BitOperations.PopCount((uint)mask))];
        WriteEmpty(buffer, stepCount, mask);
        return buffer;
    }

    /// <summary>
    /// Writes into <paramref name="destination"/> (exactly the encoded length) a payload of <paramref name="stepCount"/>
    /// steps holding the variables of <paramref name="mask"/>, all missing: a reused buffer made ready for a new cell.
    /// </summary>
    public static void WriteEmpty(Span<byte> destination, int stepCount, int mask)
    {
        var length = EncodedLength(stepCount, System.Numerics.BitOperations.PopCount((uint)mask));
        if (destination.Length != length)
            throw new ArgumentException($"The destination holds {destination.Length} bytes; a payload of {stepCount} steps with mask {mask} takes {length}.", nameof(destination));
        destination[0] = FormatVersion;
        destination[1] = (byte)mask;
        BinaryPrimitives.WriteInt32LittleEndian(destination.Slice(2), stepCount);
        destination.Slice(HeaderBytes).Fill(0xFF);
    }

    /// <summary>Byte offset of a variable's first value in a payload with the given mask.</summary>
    public static int OffsetOf(int mask, int stepCount, WaveParameter variable)
    {
        var index = System.Numerics.BitOperations.PopCount((uint)(mask & (BitOf(variable) - 1)));
        return HeaderBytes + 2 * stepCount * index;
    }

    /// <summary>
    /// Quantises one value (NaN gives <see cref="Missing"/>). Throws <see cref="ArgumentOutOfRangeException"/> naming
    /// the variable for a value below zero or above the range; direction is wrapped into 0..360 first.
    /// </summary>
    public static ushort Quantise(WaveParameter variable, float value)
    {
        var q = new SeriesQuantiser(variable).Quantise(value);
        return q == SeriesQuantiser.OutOfRange ? throw OutOfRange(variable, value) : (ushort)q;
    }

    private static ArgumentOutOfRangeException OutOfRange(WaveParameter variable, float value) =>
        new(variable.ToString(), value, $"{variable} value {value} is outside the storable range 0 to {MaximumOf(variable)}.");

    public static int StepCountOf(ReadOnlySpan<byte> payload)
    {
        CheckHeader(payload);
        return BinaryPrimitives.ReadInt32LittleEndian(payload.Slice(2));
    }

    public static bool Has(ReadOnlySpan<byte> payload, WaveParameter variable) => (payload[1] & BitOf(variable)) != 0;

    /// <summary>
    /// Decodes one variable into <paramref name="destination"/> (length = step count), NaN for missing.
    /// Returns false (and fills NaN) when the chunk does not hold the variable.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static bool Decode(ReadOnlySpan<byte> payload, WaveParameter variable, Span<float> destination)
    {
        var steps = StepCountOf(payload);
        if (destination.Length < steps) throw new ArgumentException($"Destination holds {destination.Length} values; the chunk has {steps}.");
        var mask = payload[1];
        if ((mask & BitOf(variable)) == 0)
        {
            destination[..steps].Fill(float.NaN);
            return false;
        }
        var index = 0;
        for (var v = 0; v < SlotOf(variable); v++) if ((mask & (1 << v)) != 0) index++;
        var source = payload.Slice(HeaderBytes + 2 * steps * index, 2 * steps);
        var step = (float)Steps[SlotOf(variable)];
        var done = BitConverter.IsLittleEndian ? DecodeVectors(source, step, destination[..steps]) : 0;
        for (var i = done; i < steps; i++)
        {
            var q = BinaryPrimitives.ReadUInt16LittleEndian(source.Slice(2 * i));
            destination[i] = q == Missing ? float.NaN : (float)(q * (double)step);
        }
        return true;
    }

    /// <summary>
    /// The leading whole vectors of 16 codes decoded as the scalar loop does (each code times the float step, in double,
    /// rounded to float; NaN for <see cref="Missing"/>): the same operations lane by lane, so the same bits. Returns the
    /// values decoded; the caller decodes the rest.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static int DecodeVectors(ReadOnlySpan<byte> source, float step, Span<float> destination)
    {
        if (!Vector256.IsHardwareAccelerated) return 0;
        var codes = MemoryMarshal.Cast<byte, ushort>(source);
        var scale = Vector256.Create((double)step);
        var missing = Vector256.Create((uint)Missing);
        var nan = Vector256.Create(float.NaN);
        int done = 0;
        for (; done + Vector256<ushort>.Count <= destination.Length; done += Vector256<ushort>.Count)
        {
            var (low, high) = Vector256.Widen(Vector256.Create(codes.Slice(done, Vector256<ushort>.Count)));
            Half(low).CopyTo(destination.Slice(done, Vector256<float>.Count));
            Half(high).CopyTo(destination.Slice(done + Vector256<float>.Count, Vector256<float>.Count));
        }
        return done;

        [MethodImpl(MethodImplOptions.AggressiveInlining)]
        Vector256<float> Half(Vector256<uint> q)
        {
            var (a, b) = Vector256.Widen(q);
            var values = Vector256.Narrow(Vector256.ConvertToDouble(a) * scale, Vector256.ConvertToDouble(b) * scale);
            return Vector256.ConditionalSelect(Vector256.Equals(q, missing).AsSingle(), nan, values);
        }
    }

    private static void CheckHeader(ReadOnlySpan<byte> payload)
    {
        if (payload.Length < HeaderBytes || payload[0] != FormatVersion)
            throw new InvalidDataException("A series chunk has an unknown format version or is truncated.");
    }
}
