namespace Atlas.WavePhysics;

/// <summary>
/// Group velocity at one fixed depth as a fast function of period, for computing power at hundreds of
/// millions of steps.
/// </summary>
/// <remarks>
/// The ratio of the group velocity to its deep-water value, R = cg / cg0 = 2 n tanh(k h), depends on period
/// and depth only through s = omega sqrt(h / g) = sqrt(k0 h). One table of R / s over s, shared by every depth,
/// is built once from the exact solver (<see cref="TableIntervals"/> equal intervals of s over [0, <see cref="TableEnd"/>])
/// and read by linear interpolation, so a cell costs nothing to set up and a step costs one division and one
/// interpolation. R / s rather than R is tabulated because it tends smoothly to 2 in shallow water, where R itself
/// vanishes and linear interpolation of it would lose relative accuracy. Beyond the table end (k0 h above 20.25) R is 1 to within 1e-15. The interpolation error is
/// below <see cref="MaxRelativeError"/> at every period and depth (tested against the exact solver).
/// </remarks>
public readonly struct GroupVelocityTable
{
    /// <summary>Upper end of the tabulated s = sqrt(k0 h); above it the water is deep to double precision.</summary>
    public const double TableEnd = 4.5;

    /// <summary>Number of equal intervals of s in the table.</summary>
    public const int TableIntervals = 8192;

    /// <summary>Largest relative error of <see cref="GroupVelocity"/> against the exact solver, at any period and depth.</summary>
    public const double MaxRelativeError = 1e-7;

    private const double IntervalsPerUnit = TableIntervals / TableEnd;

    // R(s_i) / s_i for s_i = i * TableEnd / TableIntervals, i = 0..TableIntervals (2 at s = 0), plus one guard entry.
    private static readonly double[] RatioOverS = BuildTable();

    // 2 pi sqrt(h / g): s = scale / T. +infinity in deep water, so that s is beyond the table end.
    private readonly double _scale;

    /// <summary>Prepares the table for one depth.</summary>
    /// <param name="depthMetres">Depth, m; NaN (unknown) or +infinity means deep water; zero or negative throws.</param>
    public GroupVelocityTable(double depthMetres)
    {
        DispersionRelation.CheckDepth(depthMetres);
        IsDeepWater = DispersionRelation.IsDeepWater(depthMetres);
        DepthMetres = IsDeepWater ? double.PositiveInfinity : depthMetres;
        _scale = IsDeepWater ? double.PositiveInfinity : 2 * Math.PI * Math.Sqrt(depthMetres / PhysicalConstants.Gravity);
    }

    /// <summary>The depth, m; +infinity for deep water.</summary>
    public double DepthMetres { get; }

    /// <summary>True when the depth was NaN or +infinity and every period propagates as in deep water.</summary>
    public bool IsDeepWater { get; }

    /// <summary>
    /// R = cg / cg0 at this depth for period T (s): 1 in deep water, tending to 2 s = 4 pi sqrt(h / g) / T in the
    /// shallow limit.
    /// </summary>
    /// <param name="periodSeconds">Period, s, positive (not checked, for speed); NaN gives NaN.</param>
    public double DeepWaterRatio(double periodSeconds)
    {
        double s = _scale / periodSeconds;
        if (!(s < TableEnd)) return double.IsNaN(s) ? double.NaN : 1.0;
        double position = s * IntervalsPerUnit;
        int i = (int)position;
        double fraction = position - i;
        double[] table = RatioOverS;
        double lower = table[i];
        return s * (lower + fraction * (table[i + 1] - lower));
    }

    /// <summary>Group velocity (m/s) for period T (s) at this depth.</summary>
    /// <param name="periodSeconds">Period, s, positive (not checked, for speed); NaN gives NaN.</param>
    public double GroupVelocity(double periodSeconds) =>
        PhysicalConstants.Gravity * periodSeconds / (4 * Math.PI) * DeepWaterRatio(periodSeconds);

    /// <summary>Omnidirectional power J (kW/m) for Hm0 (m) and Te (s) at this depth; NaN when either is NaN.</summary>
    public double Power(double hm0Metres, double energyPeriodSeconds) =>
        WavePower.DeepWaterCoefficient * hm0Metres * hm0Metres * energyPeriodSeconds * DeepWaterRatio(energyPeriodSeconds);

    private static double[] BuildTable()
    {
        var table = new double[TableIntervals + 2];
        table[0] = 2.0;
        for (int i = 1; i <= TableIntervals; i++)
        {
            double s = i * (TableEnd / TableIntervals);
            double x = DispersionRelation.SolveRelativeDepth(s * s);
            table[i] = 2 * DispersionRelation.GroupToPhaseSpeedRatioAtRelativeDepth(x) * Math.Tanh(x) / s;
        }
        table[TableIntervals + 1] = 1.0 / TableEnd;
        return table;
    }
}
