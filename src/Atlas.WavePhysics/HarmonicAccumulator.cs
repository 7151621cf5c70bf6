using System.Runtime.CompilerServices;
using System.Runtime.Intrinsics;

namespace Atlas.WavePhysics;

/// <summary>
/// The harmonic sums of <see cref="DirectionalHarmonics"/> for a run of steps, kept in registers while the run is
/// added (the streaming pass adds every step of a month to one of these, then stores it once): the even orders
/// 2..32 as four 256-bit vectors of A_k and four of B_k, e^(i k phi) advanced a vector at a time by e^(i 8 phi), the
/// moments read from the table of <see cref="DirectionalHarmonics.SpreadingMomentsTabulated"/>.
/// </summary>
public struct HarmonicAccumulator
{
    private double _total, _a1, _b1;
    private Vector256<double> _a0, _a1v, _a2, _a3, _b0, _b1v, _b2, _b3;

    /// <summary>Adds one step: power (not negative), cosine and sine of its mean direction, its spread in degrees (finite, not negative; not checked).</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public void Add(double power, double cosDirection, double sinDirection, double spreadDegrees)
    {
        _total += power;
        double sigma = spreadDegrees * (Math.PI / 180);
        double position = sigma * sigma * (DirectionalHarmonics.TableSteps / 2.0);
        if (position >= DirectionalHarmonics.TableSteps) return; // isotropic: every moment is 0
        int j = (int)position;
        double f = position - j;
        double[] table = DirectionalHarmonics.PaddedMoments;
        ref double low = ref table[j * DirectionalHarmonics.PaddedRow];
        ref double high = ref Unsafe.Add(ref low, DirectionalHarmonics.PaddedRow);

        double m1 = low + f * (high - low);
        _a1 += power * m1 * cosDirection;
        _b1 += power * m1 * sinDirection;

        double c1 = cosDirection, s1 = sinDirection;
        double c2 = c1 * c1 - s1 * s1, s2 = 2 * c1 * s1;
        double c4 = c2 * c2 - s2 * s2, s4 = 2 * c2 * s2;
        double c6 = c4 * c2 - s4 * s2, s6 = s4 * c2 + c4 * s2;
        double c8 = c4 * c4 - s4 * s4, s8 = 2 * c4 * s4;
        var cos = Vector256.Create(c2, c4, c6, c8);
        var sin = Vector256.Create(s2, s4, s6, s8);
        var stepCos = Vector256.Create(c8);
        var stepSin = Vector256.Create(s8);
        var fraction = Vector256.Create(f);
        var weight = Vector256.Create(power);

        Group(ref _a0, ref _b0, ref low, ref high, 4, fraction, weight, cos, sin);
        Rotate(ref cos, ref sin, stepCos, stepSin);
        Group(ref _a1v, ref _b1v, ref low, ref high, 8, fraction, weight, cos, sin);
        Rotate(ref cos, ref sin, stepCos, stepSin);
        Group(ref _a2, ref _b2, ref low, ref high, 12, fraction, weight, cos, sin);
        Rotate(ref cos, ref sin, stepCos, stepSin);
        Group(ref _a3, ref _b3, ref low, ref high, 16, fraction, weight, cos, sin);
    }

    /// <summary>Adds the sums to a slot's sums in the wide layout (<see cref="DirectionalHarmonics.WideLength"/> doubles) and forgets them.</summary>
    public void MoveTo(Span<double> wide)
    {
        wide[0] += _total;
        wide[1] += _a1;
        wide[2] += _b1;
        const int even = DirectionalHarmonics.HighestOrder / 2;
        Span<double> a = wide.Slice(3, even), b = wide.Slice(3 + even, even);
        (Vector256.Create<double>(a[..4]) + _a0).CopyTo(a[..4]);
        (Vector256.Create<double>(a.Slice(4, 4)) + _a1v).CopyTo(a.Slice(4, 4));
        (Vector256.Create<double>(a.Slice(8, 4)) + _a2).CopyTo(a.Slice(8, 4));
        (Vector256.Create<double>(a.Slice(12, 4)) + _a3).CopyTo(a.Slice(12, 4));
        (Vector256.Create<double>(b[..4]) + _b0).CopyTo(b[..4]);
        (Vector256.Create<double>(b.Slice(4, 4)) + _b1v).CopyTo(b.Slice(4, 4));
        (Vector256.Create<double>(b.Slice(8, 4)) + _b2).CopyTo(b.Slice(8, 4));
        (Vector256.Create<double>(b.Slice(12, 4)) + _b3).CopyTo(b.Slice(12, 4));
        this = default;
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static void Group(ref Vector256<double> a, ref Vector256<double> b, ref double low, ref double high, int offset,
        Vector256<double> fraction, Vector256<double> weight, Vector256<double> cos, Vector256<double> sin)
    {
        var lowMoments = Vector256.LoadUnsafe(ref low, (nuint)offset);
        var w = weight * (lowMoments + fraction * (Vector256.LoadUnsafe(ref high, (nuint)offset) - lowMoments));
        a += w * cos;
        b += w * sin;
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static void Rotate(ref Vector256<double> cos, ref Vector256<double> sin, Vector256<double> stepCos, Vector256<double> stepSin)
    {
        var next = cos * stepCos - sin * stepSin;
        sin = sin * stepCos + cos * stepSin;
        cos = next;
    }
}
