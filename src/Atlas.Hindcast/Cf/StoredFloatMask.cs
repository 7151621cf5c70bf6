using System.Numerics;
using System.Runtime.CompilerServices;

namespace Atlas.Hindcast;

/// <summary>
/// Which stored float values decode as missing: equal to a fill or missing value, or outside the valid range. When
/// decoding a variable changes nothing else (<see cref="CfValueDecoder.MaskOnly"/>), a reader can mask while it copies
/// instead of decoding in a pass of its own.
/// </summary>
public sealed class StoredFloatMask
{
    private readonly float[] _fills;
    private readonly Vector<float>[] _moreFills;   // beyond the first two
    private readonly float _min, _max;

    /// <param name="fills">Stored values that mean missing (NaN ones are left out: NaN stays NaN anyway).</param>
    /// <param name="min">Smallest valid stored value (negative infinity for none).</param>
    /// <param name="max">Largest valid stored value (positive infinity for none).</param>
    public StoredFloatMask(IEnumerable<float> fills, float min, float max)
    {
        _fills = fills.Where(f => !float.IsNaN(f)).Distinct().ToArray();
        // An absent fill is NaN, which no value equals; an absent bound is an infinity, which no value passes.
        Fill0 = new Vector<float>(_fills.Length > 0 ? _fills[0] : float.NaN);
        Fill1 = new Vector<float>(_fills.Length > 1 ? _fills[1] : float.NaN);
        _moreFills = _fills.Skip(2).Select(f => new Vector<float>(f)).ToArray();
        _min = min;
        _max = max;
        Min = new Vector<float>(min);
        Max = new Vector<float>(max);
    }

    /// <summary>Masks nothing: for values already decoded, whose missing values are NaN.</summary>
    public static StoredFloatMask None { get; } = new([], float.NegativeInfinity, float.PositiveInfinity);

    /// <summary>The first two fill values in every lane (NaN where there is none).</summary>
    public Vector<float> Fill0 { get; }

    /// <inheritdoc cref="Fill0"/>
    public Vector<float> Fill1 { get; }

    /// <summary>The valid range in every lane (infinite where unbounded).</summary>
    public Vector<float> Min { get; }

    /// <inheritdoc cref="Min"/>
    public Vector<float> Max { get; }

    /// <summary>True when there are more than two fill values, which <see cref="Fill0"/> and <see cref="Fill1"/> do not cover.</summary>
    public bool HasMoreFills => _moreFills.Length > 0;

    /// <summary>True when the stored value <paramref name="value"/> decodes as missing.</summary>
    public bool IsMissing(float value)
    {
        bool missing = value < _min || value > _max;
        foreach (var fill in _fills) missing |= value == fill;
        return missing;
    }

    /// <summary>All bits set in the lanes of <paramref name="values"/> that decode as missing.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public Vector<int> Missing(Vector<float> values)
    {
        var mask = Missing(values, Fill0, Fill1, Min, Max);
        foreach (var fill in _moreFills) mask |= Vector.Equals(values, fill);
        return mask;
    }

    /// <summary>The lanes equal to either fill or outside [min, max], for loops that keep the mask's vectors in registers.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vector<int> Missing(Vector<float> values, Vector<float> fill0, Vector<float> fill1, Vector<float> min, Vector<float> max) =>
        Vector.Equals(values, fill0) | Vector.Equals(values, fill1) | Vector.LessThan(values, min) | Vector.GreaterThan(values, max);
}
