namespace Atlas.WavePhysics;

/// <summary>
/// The linear dispersion relation omega^2 = g k tanh(k h), solved for the wave number at any depth.
/// </summary>
/// <remarks>
/// The relation is solved in dimensionless form, x tanh x = y with x = k h and y = k0 h = omega^2 h / g,
/// starting from the explicit approximation of Fenton and McKee (1990), which is within 1.7 % everywhere and
/// has the right shallow (x = sqrt y) and deep (x = y) limits, then refined by Newton's method to machine
/// precision (two to four steps). For y of 19 or more tanh x equals 1 to double precision and x = y is exact.
/// Depth NaN or +infinity means deep water (k = omega^2 / g). A zero, negative or -infinite depth is misuse
/// and throws. A NaN period gives NaN results (a missing step); a zero, negative or infinite period throws.
/// </remarks>
public static class DispersionRelation
{
    /// <summary>Above this k0 h, tanh(k h) is 1 to double precision and the deep-water root is exact.</summary>
    private const double DeepWaterDepthParameter = 19.0;

    private const int MaximumNewtonSteps = 30;

    /// <summary>True when the depth stands for deep water: NaN (unknown) or +infinity.</summary>
    public static bool IsDeepWater(double depthMetres) => double.IsNaN(depthMetres) || double.IsPositiveInfinity(depthMetres);

    /// <summary>Deep-water wavelength L0 = g T^2 / (2 pi), m (1.5613 T^2 with g = 9.81).</summary>
    /// <param name="periodSeconds">Wave period, s. NaN gives NaN.</param>
    public static double DeepWaterWavelength(double periodSeconds)
    {
        CheckPeriod(periodSeconds);
        return PhysicalConstants.Gravity * periodSeconds * periodSeconds / (2 * Math.PI);
    }

    /// <summary>
    /// Solves x tanh x = y for x (x = k h, y = k0 h = omega^2 h / g), the dimensionless form of the relation.
    /// </summary>
    /// <param name="deepWaterDepthParameter">y = k0 h, positive; +infinity returns +infinity; NaN returns NaN.</param>
    /// <returns>k h.</returns>
    public static double SolveRelativeDepth(double deepWaterDepthParameter)
    {
        double y = deepWaterDepthParameter;
        if (double.IsNaN(y)) return double.NaN;
        if (!(y > 0)) throw new ArgumentOutOfRangeException(nameof(deepWaterDepthParameter), y, "k0 h must be positive.");
        if (y >= DeepWaterDepthParameter) return y;

        double x = DispersionApproximation.FentonMcKeeRelativeDepth(y);
        for (int step = 0; step < MaximumNewtonSteps; step++)
        {
            double t = Math.Tanh(x);
            double f = x * t - y;
            double derivative = t + x * (1 - t * t);
            double dx = f / derivative;
            x -= dx;
            if (Math.Abs(dx) <= 1e-15 * x) break;
        }
        return x;
    }

    /// <summary>Wave number k (rad/m) for angular frequency omega (rad/s) at depth h (m).</summary>
    /// <param name="angularFrequency">omega, rad/s, positive; NaN gives NaN.</param>
    /// <param name="depthMetres">Depth, m, positive; NaN or +infinity means deep water.</param>
    public static double WaveNumberFromAngularFrequency(double angularFrequency, double depthMetres)
    {
        CheckDepth(depthMetres);
        if (double.IsNaN(angularFrequency)) return double.NaN;
        if (!(angularFrequency > 0) || double.IsInfinity(angularFrequency))
            throw new ArgumentOutOfRangeException(nameof(angularFrequency), angularFrequency, "Angular frequency must be positive and finite.");
        double k0 = angularFrequency * angularFrequency / PhysicalConstants.Gravity;
        if (IsDeepWater(depthMetres)) return k0;
        return SolveRelativeDepth(k0 * depthMetres) / depthMetres;
    }

    /// <summary>Wave number k (rad/m) for period T (s) at depth h (m).</summary>
    /// <param name="periodSeconds">Period, s, positive; NaN gives NaN.</param>
    /// <param name="depthMetres">Depth, m, positive; NaN or +infinity means deep water.</param>
    public static double WaveNumber(double periodSeconds, double depthMetres)
    {
        CheckPeriod(periodSeconds);
        return WaveNumberFromAngularFrequency(2 * Math.PI / periodSeconds, depthMetres);
    }

    /// <summary>Solves the relation and returns every derived quantity of the wave.</summary>
    /// <param name="periodSeconds">Period, s, positive; NaN gives a wave whose quantities are all NaN.</param>
    /// <param name="depthMetres">Depth, m, positive; NaN or +infinity means deep water (reported as +infinity).</param>
    public static LinearWave Solve(double periodSeconds, double depthMetres)
    {
        CheckPeriod(periodSeconds);
        CheckDepth(depthMetres);
        double depth = IsDeepWater(depthMetres) ? double.PositiveInfinity : depthMetres;
        double omega = 2 * Math.PI / periodSeconds;
        double k = WaveNumberFromAngularFrequency(omega, depthMetres);
        double n = GroupToPhaseSpeedRatioAtRelativeDepth(k * depth);
        double c = omega / k;
        return new LinearWave(periodSeconds, depth, k, 2 * Math.PI / k, c, n * c, n);
    }

    /// <summary>Wavelength L (m) for period T (s) at depth h (m).</summary>
    public static double Wavelength(double periodSeconds, double depthMetres) => 2 * Math.PI / WaveNumber(periodSeconds, depthMetres);

    /// <summary>Phase speed c = omega / k (m/s) for period T (s) at depth h (m).</summary>
    public static double PhaseSpeed(double periodSeconds, double depthMetres) => Solve(periodSeconds, depthMetres).PhaseSpeed;

    /// <summary>Group velocity cg = n c (m/s) for period T (s) at depth h (m); g T / (4 pi) in deep water.</summary>
    public static double GroupVelocity(double periodSeconds, double depthMetres) => Solve(periodSeconds, depthMetres).GroupVelocity;

    /// <summary>n = cg / c for period T (s) at depth h (m).</summary>
    public static double GroupToPhaseSpeedRatio(double periodSeconds, double depthMetres) => Solve(periodSeconds, depthMetres).GroupToPhaseSpeedRatio;

    /// <summary>
    /// n = (1 + 2x / sinh 2x) / 2 at relative depth x = k h; 1/2 for x = +infinity (and, to double precision,
    /// for x above 20), 1 in the limit x -> 0.
    /// </summary>
    public static double GroupToPhaseSpeedRatioAtRelativeDepth(double relativeDepth)
    {
        double x = relativeDepth;
        if (double.IsNaN(x)) return double.NaN;
        if (x > 20) return 0.5;
        if (x < 1e-8) return 1.0;
        return 0.5 * (1 + 2 * x / Math.Sinh(2 * x));
    }

    internal static void CheckPeriod(double periodSeconds)
    {
        if (double.IsNaN(periodSeconds)) return;
        if (!(periodSeconds > 0) || double.IsInfinity(periodSeconds))
            throw new ArgumentOutOfRangeException(nameof(periodSeconds), periodSeconds, "Wave period must be positive and finite (s).");
    }

    internal static void CheckDepth(double depthMetres)
    {
        if (IsDeepWater(depthMetres)) return;
        if (!(depthMetres > 0))
            throw new ArgumentOutOfRangeException(nameof(depthMetres), depthMetres,
                "Depth must be positive (m); use NaN or +infinity for deep water.");
    }
}
