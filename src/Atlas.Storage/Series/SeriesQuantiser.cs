using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using System.Runtime.Intrinsics;

namespace Atlas.Storage.Series;

/// <summary>
/// The quantisation of <see cref="SeriesCodec"/> for the values of one variable, its step looked up once: the one
/// place its arithmetic is written (the step division, rounding half to even, direction wrapped into 0..360). A value
/// outside the storable range gives <see cref="OutOfRange"/> instead of an exception, so that a loop over millions of
/// values holds no handler; the caller names the value.
/// </summary>
public readonly struct SeriesQuantiser
{
    /// <summary>What <see cref="Quantise"/> gives for a value below zero, above the range, or infinite.</summary>
    public const int OutOfRange = -1;

    private readonly double _step;
    private readonly bool _wrap;

    public SeriesQuantiser(WaveParameter variable)
    {
        _step = SeriesCodec.StepOf(variable);
        _wrap = variable == WaveParameter.Dir;
    }

    /// <summary>The stored 16-bit value of <paramref name="value"/> (<see cref="SeriesCodec.Missing"/> for NaN), or <see cref="OutOfRange"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public int Quantise(float value)
    {
        double v = value;
        if (double.IsNaN(v)) return SeriesCodec.Missing;
        // Before the wrap: an infinite direction's remainder is NaN, which had made it north (code 0).
        if (double.IsInfinity(v)) return OutOfRange;
        if (_wrap) { v %= 360.0; if (v < 0) v += 360.0; }
        var scaled = Math.Round(v / _step);
        if (_wrap && scaled >= 36000) scaled = 0;
        if (scaled < 0 || scaled >= SeriesCodec.Missing) return OutOfRange;
        return (int)scaled;
    }

    /// <summary>
    /// Quantises a run of values into <paramref name="into"/> exactly as <see cref="Quantise"/> does one by one (the
    /// same division by the step, the same rounding half to even, NaN to <see cref="SeriesCodec.Missing"/>), eight or
    /// four values at a time where the processor has vector registers for them: the division was most of an
    /// ingest's transposition, one value at a time. False as soon as a value is out of range, with
    /// <paramref name="into"/> partly written: the caller then goes value by value to name it, or to skip it where it
    /// does not count.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public bool TryQuantise(ReadOnlySpan<float> values, Span<ushort> into)
    {
        if (into.Length < values.Length) throw new ArgumentException("The destination is shorter than the values.", nameof(into));
        var i = 0;
        ref var source = ref MemoryMarshal.GetReference(values);
        if (Vector512.IsHardwareAccelerated)
        {
            var step = Vector512.Create(_step);
            for (; i + Vector512<double>.Count <= values.Length; i += Vector512<double>.Count)
            {
                var (low, high) = Vector256.Widen(Vector256.LoadUnsafe(ref source, (nuint)i));
                if (!TryQuantiseLanes(Vector512.Create(low, high), step, values.Slice(i, Vector512<double>.Count), into.Slice(i))) return false;
            }
        }
        else if (Vector256.IsHardwareAccelerated)
        {
            var step = Vector256.Create(_step);
            for (; i + Vector256<double>.Count <= values.Length; i += Vector256<double>.Count)
            {
                var (low, high) = Vector128.Widen(Vector128.LoadUnsafe(ref source, (nuint)i));
                if (!TryQuantiseLanes(Vector256.Create(low, high), step, values.Slice(i, Vector256<double>.Count), into.Slice(i))) return false;
            }
        }
        for (; i < values.Length; i++)
        {
            var q = Quantise(values[i]);
            if (q == OutOfRange) return false;
            into[i] = (ushort)q;
        }
        return true;
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private bool TryQuantiseLanes(Vector512<double> v, Vector512<double> step, ReadOnlySpan<float> lanes, Span<ushort> into)
    {
        var missing = Vector512.Create((double)SeriesCodec.Missing);
        var nan = Vector512.IsNaN(v);
        if (_wrap)
        {
            // Within 0..360 the remainder by 360 is the value itself; any other direction (not NaN) goes one by one.
            var inCircle = Vector512.GreaterThanOrEqual(v, Vector512<double>.Zero) & Vector512.LessThan(v, Vector512.Create(360.0));
            if ((inCircle | nan) != Vector512<double>.AllBitsSet) return QuantiseEach(lanes, into);
        }
        var scaled = Vector512.Round(v / step);
        if (_wrap) scaled = Vector512.ConditionalSelect(Vector512.GreaterThanOrEqual(scaled, Vector512.Create(36000.0)), Vector512<double>.Zero, scaled);
        // NaN compares false both ways; infinities land outside the range.
        var outside = Vector512.LessThan(scaled, Vector512<double>.Zero) | Vector512.GreaterThanOrEqual(scaled, missing);
        if (outside != Vector512<double>.Zero) return false;
        var quantised = Vector512.ConvertToInt64(Vector512.ConditionalSelect(nan, missing, scaled));
        for (var k = 0; k < Vector512<double>.Count; k++) into[k] = (ushort)quantised.GetElement(k);
        return true;
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private bool TryQuantiseLanes(Vector256<double> v, Vector256<double> step, ReadOnlySpan<float> lanes, Span<ushort> into)
    {
        var missing = Vector256.Create((double)SeriesCodec.Missing);
        var nan = Vector256.IsNaN(v);
        if (_wrap)
        {
            var inCircle = Vector256.GreaterThanOrEqual(v, Vector256<double>.Zero) & Vector256.LessThan(v, Vector256.Create(360.0));
            if ((inCircle | nan) != Vector256<double>.AllBitsSet) return QuantiseEach(lanes, into);
        }
        var scaled = Vector256.Round(v / step);
        if (_wrap) scaled = Vector256.ConditionalSelect(Vector256.GreaterThanOrEqual(scaled, Vector256.Create(36000.0)), Vector256<double>.Zero, scaled);
        var outside = Vector256.LessThan(scaled, Vector256<double>.Zero) | Vector256.GreaterThanOrEqual(scaled, missing);
        if (outside != Vector256<double>.Zero) return false;
        var quantised = Vector256.ConvertToInt64(Vector256.ConditionalSelect(nan, missing, scaled));
        for (var k = 0; k < Vector256<double>.Count; k++) into[k] = (ushort)quantised.GetElement(k);
        return true;
    }

    private bool QuantiseEach(ReadOnlySpan<float> lanes, Span<ushort> into)
    {
        for (var k = 0; k < lanes.Length; k++)
        {
            var q = Quantise(lanes[k]);
            if (q == OutOfRange) return false;
            into[k] = (ushort)q;
        }
        return true;
    }
}
