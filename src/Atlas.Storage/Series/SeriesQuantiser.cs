using System.Runtime.CompilerServices;

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
        if (_wrap) { v %= 360.0; if (v < 0) v += 360.0; }
        var scaled = Math.Round(v / _step);
        if (_wrap && scaled >= 36000) scaled = 0;
        if (scaled < 0 || scaled >= SeriesCodec.Missing || double.IsInfinity(v)) return OutOfRange;
        return (int)scaled;
    }
}
