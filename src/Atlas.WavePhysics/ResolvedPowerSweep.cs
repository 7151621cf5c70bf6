using System.Runtime.CompilerServices;

namespace Atlas.WavePhysics;

/// <summary>
/// The largest directionally resolved power J_theta = sum_k P_k max(cos(theta - theta_k), 0) of power components on
/// fixed directions (the bins of a directional spectrum), maximised exactly over every theta, in a time linear in the
/// number of directions once the directions are known.
/// </summary>
/// <remarks>
/// Component k counts while theta lies within 90 degrees of theta_k, so the circle splits at the points theta_k +- 90
/// degrees into arcs on which the set of counted components is fixed and J_theta = A cos theta + B sin theta. Its
/// maximum on an arc is at an end or at atan2(B, A) when that lies inside. The arcs and which component enters or leaves
/// at each depend on the directions only and are laid out once; per spectrum only the running sums A and B move.
/// Gives the same maximum as <see cref="Directionality.FromComponents"/>, which evaluates every candidate afresh.
/// </remarks>
public sealed class ResolvedPowerSweep
{
    private readonly double[] _cos, _sin;
    private readonly double[] _start;          // arc starts, radians, increasing
    private readonly double[] _startCos, _startSin;
    private readonly int[][] _entering, _leaving; // components that start or stop counting at each arc start (after the first)
    private readonly int[] _initial;             // components counted on the first arc

    /// <param name="directionsDegrees">The directions of the components, degrees (one convention, from or towards).</param>
    public ResolvedPowerSweep(ReadOnlySpan<double> directionsDegrees)
    {
        int n = directionsDegrees.Length;
        if (n == 0) throw new ArgumentException("At least one direction is needed.", nameof(directionsDegrees));
        _cos = new double[n];
        _sin = new double[n];
        var events = new List<(double Angle, int Component, bool Enters)>(2 * n);
        for (int k = 0; k < n; k++)
        {
            if (!double.IsFinite(directionsDegrees[k]))
                throw new ArgumentException($"Direction {k} is {directionsDegrees[k]}; directions must be finite.", nameof(directionsDegrees));
            double a = directionsDegrees[k] * Math.PI / 180;
            (_sin[k], _cos[k]) = Math.SinCos(a);
            events.Add((Normalise(a - Math.PI / 2), k, true));
            events.Add((Normalise(a + Math.PI / 2), k, false));
        }
        events.Sort((x, y) => x.Angle.CompareTo(y.Angle));

        // Events closer than a nanoradian happen at one point: they start one arc.
        var starts = new List<double>();
        var entering = new List<List<int>>();
        var leaving = new List<List<int>>();
        foreach (var (angle, component, enters) in events)
        {
            if (starts.Count == 0 || angle - starts[^1] > 1e-9)
            {
                starts.Add(angle);
                entering.Add([]);
                leaving.Add([]);
            }
            (enters ? entering[^1] : leaving[^1]).Add(component);
        }
        _start = [.. starts];
        _startCos = new double[_start.Length];
        _startSin = new double[_start.Length];
        for (int r = 0; r < _start.Length; r++) (_startSin[r], _startCos[r]) = Math.SinCos(_start[r]);
        _entering = entering.Select(list => list.ToArray()).ToArray();
        _leaving = leaving.Select(list => list.ToArray()).ToArray();

        double firstEnd = _start.Length > 1 ? _start[1] : _start[0] + 2 * Math.PI;
        var (midSin, midCos) = Math.SinCos(0.5 * (_start[0] + firstEnd));
        var initial = new List<int>();
        for (int k = 0; k < n; k++)
            if (midCos * _cos[k] + midSin * _sin[k] > 0) initial.Add(k);
        _initial = [.. initial];
    }

    public int DirectionCount => _cos.Length;

    /// <summary>The largest J_theta of the component powers and the direction it is resolved in.</summary>
    /// <param name="powers">Power of each component (one per direction), finite and not negative; not checked here.</param>
    /// <returns>The total, the maximum, its direction (degrees 0..360, the convention of the directions) and the
    /// coefficient; NaN maximum, direction and coefficient when the total is 0.</returns>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public DirectionalPower Maximum(ReadOnlySpan<double> powers)
    {
        if (powers.Length != _cos.Length)
            throw new ArgumentException($"There are {powers.Length} powers for {_cos.Length} directions.", nameof(powers));
        double total = 0;
        foreach (double p in powers) total += p;
        if (!(total > 0)) return new DirectionalPower(total, double.NaN, double.NaN, double.NaN);

        double a = 0, b = 0;
        foreach (int k in _initial) { a += powers[k] * _cos[k]; b += powers[k] * _sin[k]; }
        // The best so far is an arc start (its index) or a stationary point (its vector (A, B)); its angle is found once at the end.
        double best = double.NegativeInfinity, bestA = 0, bestB = 0;
        int bestStart = 0;
        int arcs = _start.Length;
        for (int r = 0; r < arcs; r++)
        {
            if (r > 0)
            {
                foreach (int k in _entering[r]) { a += powers[k] * _cos[k]; b += powers[k] * _sin[k]; }
                foreach (int k in _leaving[r]) { a -= powers[k] * _cos[k]; b -= powers[k] * _sin[k]; }
            }
            double atStart = a * _startCos[r] + b * _startSin[r];
            if (atStart > best) { best = atStart; bestStart = r; bestA = bestB = 0; }
            double squared = a * a + b * b;
            // The stationary value sqrt(A^2 + B^2) is never below the value at the arc's start, so it can only win when
            // it exceeds the best so far; only then is it asked whether atan2(B, A) lies on this arc.
            if (squared == 0 || (best >= 0 && !(squared > best * best)) || !OnArc(r, a, b)) continue;
            best = Math.Sqrt(squared);
            bestA = a;
            bestB = b;
        }
        double angle = bestA == 0 && bestB == 0 ? _start[bestStart] : Math.Atan2(bestB, bestA);
        return new DirectionalPower(total, best, Normalise(angle) * 180 / Math.PI, best / total);
    }

    /// <summary>
    /// Whether the direction of (a, b) lies on arc r, from its start (included) to the next start (excluded): by cross
    /// products for arcs shorter than half the circle, by the angle itself for longer ones.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private bool OnArc(int r, double a, double b)
    {
        int next = r + 1 < _start.Length ? r + 1 : 0;
        double length = (r + 1 < _start.Length ? _start[r + 1] : _start[0] + 2 * Math.PI) - _start[r];
        if (length < Math.PI)
            return _startCos[r] * b - _startSin[r] * a >= 0 && a * _startSin[next] - b * _startCos[next] > 0;
        return Normalise(Math.Atan2(b, a) - _start[r]) < length;
    }

    private static double Normalise(double angle)
    {
        double r = angle % (2 * Math.PI);
        return r < 0 ? r + 2 * Math.PI : r;
    }
}
