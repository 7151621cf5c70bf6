namespace Atlas.Demo;

/// <summary>
/// Linear-theory shallow-water factors per wet cell as a function of wave period: the phase-speed
/// ratio c/c0 = tanh(kh) that drives refraction (Snell's law), and the shoaling coefficient
/// Ks = sqrt(cg0/cg). The wavelength comes from the explicit Fenton and McKee (1990) approximation
/// L = L0 tanh((2 pi h / L0)^(3/4))^(2/3), which is within about 1.5 % of the exact dispersion
/// root, ample for a synthetic scenario. Periods outside the table clamp to its ends.
/// </summary>
public sealed class ShoalingTable
{
    /// <summary>Gravitational acceleration, m/s2.</summary>
    public const double Gravity = 9.81;

    /// <summary>Shortest tabulated period, s.</summary>
    public const double MinimumPeriodSeconds = 1.0;

    /// <summary>Period step of the table, s.</summary>
    public const double PeriodStepSeconds = 0.25;

    /// <summary>Number of tabulated periods (1 s to 26 s).</summary>
    public const int PeriodCount = 101;

    private readonly float[] _speedRatio;
    private readonly float[] _shoaling;

    /// <summary>Tabulates every wet cell of <paramref name="depthMetres"/>.</summary>
    public ShoalingTable(double[] depthMetres)
    {
        int n = depthMetres.Length;
        _speedRatio = new float[n * PeriodCount];
        _shoaling = new float[n * PeriodCount];
        for (int k = 0; k < n; k++)
        {
            for (int p = 0; p < PeriodCount; p++)
            {
                double period = MinimumPeriodSeconds + p * PeriodStepSeconds;
                (double ratio, double ks) = Factors(depthMetres[k], period);
                _speedRatio[k * PeriodCount + p] = (float)ratio;
                _shoaling[k * PeriodCount + p] = (float)ks;
            }
        }
    }

    /// <summary>tanh(kh) and Ks at depth <paramref name="depthMetres"/> for period <paramref name="periodSeconds"/>.</summary>
    public static (double SpeedRatio, double ShoalingCoefficient) Factors(double depthMetres, double periodSeconds)
    {
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(depthMetres);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(periodSeconds);
        double l0 = Gravity * periodSeconds * periodSeconds / (2 * Math.PI);
        double ratio = Math.Pow(Math.Tanh(Math.Pow(2 * Math.PI * depthMetres / l0, 0.75)), 2.0 / 3.0);
        double kh = 2 * Math.PI * depthMetres / (l0 * ratio);
        // n = cg / c; sinh overflows harmlessly to infinity in deep water, giving n = 1/2.
        double n = 0.5 * (1 + 2 * kh / Math.Sinh(2 * kh));
        return (ratio, Math.Sqrt(1.0 / (2 * n * ratio)));
    }

    /// <summary>tanh(kh) and Ks of wet cell k for a period, interpolated in the table.</summary>
    public (double SpeedRatio, double ShoalingCoefficient) Look(int k, double periodSeconds)
    {
        double position = (periodSeconds - MinimumPeriodSeconds) / PeriodStepSeconds;
        int p0;
        double f;
        if (position <= 0) { p0 = 0; f = 0; }
        else if (position >= PeriodCount - 1) { p0 = PeriodCount - 2; f = 1; }
        else { p0 = (int)position; f = position - p0; }
        int at = k * PeriodCount + p0;
        return (_speedRatio[at] + f * (_speedRatio[at + 1] - _speedRatio[at]),
                _shoaling[at] + f * (_shoaling[at + 1] - _shoaling[at]));
    }
}
