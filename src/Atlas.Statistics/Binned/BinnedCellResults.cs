namespace Atlas.Statistics.Binned;

/// <summary>
/// The statistics of one cell as <see cref="BinnedCellStatistics"/> gives them, held in arrays that are reused from cell
/// to cell: what the layer pass reads, with nothing allocated per cell or period
/// (<see cref="BinnedCellCalculator.Compute(in CellSeries, BinnedCellResults)"/>). Valid until the next cell is computed
/// into it.
/// </summary>
public sealed class BinnedCellResults
{
    private PeriodResult[] _periods = [];
    private double[] _hsFractions = [], _powerFractions = [], _roses = [];
    private double[] _hsThresholds = [], _powerThresholds = [];

    /// <summary>The cell depth, m; NaN when unknown.</summary>
    public double DepthMetres { get; private set; }

    /// <summary>True when the depth was unknown and power was computed for deep water.</summary>
    public bool DeepWaterAssumed { get; private set; }

    /// <summary>Where Te came from.</summary>
    public EnergyPeriodSource EnergyPeriodSource { get; private set; }

    /// <summary>Periods present, in the order of <see cref="BinnedCellStatistics.Periods"/>.</summary>
    public int PeriodCount { get; private set; }

    /// <summary>Hs exceedance thresholds (m), in the order of <see cref="HsExceedance"/>.</summary>
    public ReadOnlySpan<double> HsThresholds => _hsThresholds;

    /// <summary>Power exceedance thresholds (kW/m), in the order of <see cref="PowerExceedance"/>.</summary>
    public ReadOnlySpan<double> PowerThresholds => _powerThresholds;

    /// <summary>The statistics of period <paramref name="index"/>.</summary>
    public ref readonly PeriodResult Period(int index) => ref _periods.AsSpan(0, PeriodCount)[index];

    /// <summary>The index of a period, or -1 when it is not present.</summary>
    public int IndexOf(AtlasPeriod period)
    {
        for (int i = 0; i < PeriodCount; i++)
            if (_periods[i].Period == period) return i;
        return -1;
    }

    /// <summary>Fraction of valid steps with Hs above each threshold, in period <paramref name="index"/>.</summary>
    public ReadOnlySpan<double> HsExceedance(int index) => Row(_hsFractions, index, HsThresholds.Length);

    /// <summary>Fraction of valid steps with power above each threshold, in period <paramref name="index"/>.</summary>
    public ReadOnlySpan<double> PowerExceedance(int index) => Row(_powerFractions, index, PowerThresholds.Length);

    /// <summary>The power rose of period <paramref name="index"/> (<see cref="DirectionStatistics.Sectors"/> shares), empty without one.</summary>
    public ReadOnlySpan<double> PowerRose(int index) =>
        Period(index).Direction.HasRose ? Row(_roses, index, DirectionStatistics.Sectors) : [];

    /// <summary>The same statistics as objects (allocated).</summary>
    public BinnedCellStatistics ToStatistics()
    {
        var periods = new PeriodStatistics[PeriodCount];
        for (int i = 0; i < periods.Length; i++)
        {
            ref readonly PeriodResult p = ref Period(i);
            periods[i] = new PeriodStatistics(p.Period, p.ExpectedSteps, p.Hs, p.Te, p.Tp, p.J, p.Spread, p.D,
                p.Direction.ToStatistics(PowerRose(i), p.DirectionalityCoefficient, p.MaxPowerFromDeg),
                Fractions(_hsThresholds, HsExceedance(i)), Fractions(_powerThresholds, PowerExceedance(i)), p.LowCoverage);
        }
        return new BinnedCellStatistics(DepthMetres, DeepWaterAssumed, EnergyPeriodSource, periods);
    }

    /// <summary>Makes room for a cell's periods (growing only when the shape changes) and records what describes the cell.</summary>
    internal void Begin(int periods, double[] hsThresholds, double[] powerThresholds, double depthMetres, bool deepWaterAssumed,
        EnergyPeriodSource source)
    {
        if (_periods.Length < periods) _periods = new PeriodResult[periods];
        Grow(ref _hsFractions, periods * hsThresholds.Length);
        Grow(ref _powerFractions, periods * powerThresholds.Length);
        Grow(ref _roses, periods * DirectionStatistics.Sectors);
        (PeriodCount, _hsThresholds, _powerThresholds) = (periods, hsThresholds, powerThresholds);
        (DepthMetres, DeepWaterAssumed, EnergyPeriodSource) = (depthMetres, deepWaterAssumed, source);
    }

    internal void Set(int index, in PeriodResult result) => _periods[index] = result;

    internal Span<double> HsExceedanceOf(int index) => _hsFractions.AsSpan(index * _hsThresholds.Length, _hsThresholds.Length);

    internal Span<double> PowerExceedanceOf(int index) => _powerFractions.AsSpan(index * _powerThresholds.Length, _powerThresholds.Length);

    internal Span<double> RoseOf(int index) => _roses.AsSpan(index * DirectionStatistics.Sectors, DirectionStatistics.Sectors);

    private ReadOnlySpan<double> Row(double[] values, int index, int width)
    {
        ArgumentOutOfRangeException.ThrowIfGreaterThanOrEqual((uint)index, (uint)PeriodCount, nameof(index));
        return values.AsSpan(index * width, width);
    }

    private static ExceedanceFraction[] Fractions(double[] thresholds, ReadOnlySpan<double> fractions)
    {
        var result = new ExceedanceFraction[thresholds.Length];
        for (int t = 0; t < result.Length; t++) result[t] = new ExceedanceFraction(thresholds[t], fractions[t]);
        return result;
    }

    private static void Grow(ref double[] values, int length)
    {
        if (values.Length < length) values = new double[length];
    }
}

/// <summary>The statistics of one period in <see cref="BinnedCellResults"/>: <see cref="PeriodStatistics"/> without its lists.</summary>
/// <param name="Direction">Power-weighted direction; its rose is <see cref="BinnedCellResults.PowerRose"/>.</param>
/// <param name="DirectionalityCoefficient">See <see cref="DirectionStatistics.DirectionalityCoefficient"/>.</param>
/// <param name="MaxPowerFromDeg">See <see cref="DirectionStatistics.MaxPowerFromDeg"/>.</param>
public readonly record struct PeriodResult(
    AtlasPeriod Period,
    long ExpectedSteps,
    SummaryStatistics Hs,
    SummaryStatistics Te,
    SummaryStatistics Tp,
    SummaryStatistics J,
    SummaryStatistics Spread,
    SummaryStatistics D,
    DirectionSummary Direction,
    double DirectionalityCoefficient,
    double MaxPowerFromDeg,
    bool LowCoverage)
{
    /// <summary>The summary of a parameter that has one (hs, te, tp, j, spread, d), as <see cref="PeriodStatistics.Summary"/>.</summary>
    public SummaryStatistics Summary(WaveParameter parameter) => ParameterSummaries.Pick(parameter, Hs, Te, Tp, J, Spread, D);
}
