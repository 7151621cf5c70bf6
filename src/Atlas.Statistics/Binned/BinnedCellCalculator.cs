using System.Runtime.CompilerServices;

namespace Atlas.Statistics.Binned;

/// <summary>
/// The layer pass: statistics of one cell for every period present in its timeline, in one streaming pass per
/// parameter over the cell's series.
/// </summary>
/// <remarks>
/// <para>
/// Moments are accumulated per (year, month) slot in double precision and merged into months, seasons, the annual
/// period and each year, so each step is read once. Percentiles come from fixed-bin histograms (the bins of
/// <see cref="StatisticsOptions"/>, stated in the download metadata), kept per calendar month and per year and
/// read together for seasons and the annual period; they are within one bin width of the exact percentiles.
/// Power is computed per step from Hs and Te with the group velocity tabulated for the cell depth, and averaged
/// afterwards. Direction is averaged on the circle, weighted by power.
/// </para>
/// <para>
/// An instance reuses its buffers from cell to cell and allocates only the results; the calendar of the timeline
/// is built once and reused while the cells share it. Not thread-safe: use one calculator per worker thread.
/// </para>
/// </remarks>
public sealed class BinnedCellCalculator
{
    private readonly DerivedSeriesBuffers _derived = new();
    private readonly ParameterAccumulator _hs, _te, _tp, _power, _spread;
    private readonly DirectionAccumulator _direction = new();
    private readonly DirectionalityAccumulator _directionality = new();
    private TimelineCalendar? _calendar;
    private BinnedCellResults? _results;
    private readonly double[] _hsThresholds, _powerThresholds;

    /// <summary>A calculator with the given settings (the defaults when null).</summary>
    /// <exception cref="ArgumentException">A setting is not usable; the message names it.</exception>
    public BinnedCellCalculator(StatisticsOptions? options = null)
    {
        Options = options ?? new StatisticsOptions();
        Options.Validate();
        _hs = new ParameterAccumulator(WaveParameter.Hs, Options.HsBinning, Options.HsThresholdsMetres);
        _te = new ParameterAccumulator(WaveParameter.Te, Options.PeriodBinning, []);
        _tp = new ParameterAccumulator(WaveParameter.Tp, Options.PeriodBinning, []);
        _power = new ParameterAccumulator(WaveParameter.J, Options.PowerBinning, Options.PowerThresholdsKilowattsPerMetre);
        _spread = new ParameterAccumulator(WaveParameter.Spread, Options.SpreadBinning, []);
        _hsThresholds = [.. Options.HsThresholdsMetres];
        _powerThresholds = [.. Options.PowerThresholdsKilowattsPerMetre];
    }

    /// <summary>The settings.</summary>
    public StatisticsOptions Options { get; }

    /// <summary>Statistics of one cell.</summary>
    /// <param name="series">The cell's series on the dataset timeline.</param>
    /// <returns>One entry per period with at least one step in the timeline; none for an empty timeline. Parameters
    /// that are absent, or whose steps are all missing, have NaN statistics with count 0.</returns>
    /// <exception cref="ArgumentException">The series lengths disagree, the depth is not positive, or a time is out of range.</exception>
    public BinnedCellStatistics Compute(in CellSeries series)
    {
        var results = _results ??= new BinnedCellResults();
        Compute(series, results);
        return results.ToStatistics();
    }

    /// <summary>
    /// Statistics of one cell into <paramref name="into"/>, the same as <see cref="Compute(in CellSeries)"/> gives but
    /// held in reused arrays: nothing is allocated once the arrays have the timeline's shape.
    /// </summary>
    /// <exception cref="ArgumentException">The series lengths disagree, the depth is not positive, or a time is out of range.</exception>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public void Compute(in CellSeries series, BinnedCellResults into)
    {
        ArgumentNullException.ThrowIfNull(into);
        series.Validate();
        TimelineCalendar calendar = CalendarFor(series.Times);
        try
        {
            DerivedSeries derived = _derived.Derive(series, Options);
            Accumulate(_hs, calendar, series.Hs);
            Accumulate(_te, calendar, derived.Te);
            Accumulate(_tp, calendar, series.Tp);
            Accumulate(_power, calendar, derived.Power);
            Accumulate(_spread, calendar, series.Spread);
            if (series.Dir.Length > 0 && derived.Power.Length > 0)
            {
                _direction.Prepare(calendar);
                _direction.Accumulate(series.Dir, derived.Power);
                if (series.Spread.Length > 0)
                {
                    _directionality.Prepare(calendar);
                    _directionality.Accumulate(series.Dir, series.Spread, derived.Power);
                }
            }

            into.Begin(calendar.PeriodsPresent.Count, _hsThresholds, _powerThresholds, series.DepthMetres, derived.DeepWaterAssumed,
                derived.EnergyPeriodSource);
            for (int i = 0; i < into.PeriodCount; i++) Summarise(calendar, calendar.PeriodsPresent[i], derived.Power.Length > 0, into, i);
        }
        finally
        {
            _hs.Clear();
            _te.Clear();
            _tp.Clear();
            _power.Clear();
            _spread.Clear();
            _directionality.Clear();
            _direction.Clear();
        }
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void Summarise(TimelineCalendar calendar, AtlasPeriod period, bool hasPower, BinnedCellResults into, int index)
    {
        long expected = calendar.ExpectedSteps(period);
        SummaryStatistics hs = _hs.Summarise(period, expected);
        SummaryStatistics power = _power.Summarise(period, expected);
        double coreCoverage = hasPower ? power.Coverage : hs.Coverage;
        // Directions merge the period's (year, month) slots, each calendar month weighted by its expected steps when balanced.
        Span<long> expectedByMonth = stackalloc long[12];
        calendar.ExpectedByMonth(period, expectedByMonth);
        ReadOnlySpan<int> slots = calendar.SlotsOf(period);
        bool balanced = MonthBalance.Applies(period);
        PeriodDirectionality directionality = _directionality.Summarise(slots, expected, expectedByMonth, balanced);
        DirectionSummary direction = _direction.SummariseInto(slots, expected, expectedByMonth, balanced, into.RoseOf(index));
        _hs.ExceedancesInto(period, hs.Count, into.HsExceedanceOf(index));
        _power.ExceedancesInto(period, power.Count, into.PowerExceedanceOf(index));
        into.Set(index, new PeriodResult(
            period,
            expected,
            hs,
            _te.Summarise(period, expected),
            _tp.Summarise(period, expected),
            power,
            _spread.Summarise(period, expected),
            directionality.AsSummary(),
            direction,
            directionality.Coefficient,
            directionality.MaxPowerFromDegrees,
            coreCoverage < Options.LowCoverageThreshold));
    }

    private static void Accumulate(ParameterAccumulator accumulator, TimelineCalendar calendar, ReadOnlySpan<float> values)
    {
        if (values.Length == 0 || values.Length != calendar.StepCount) return;
        accumulator.Prepare(calendar);
        accumulator.Accumulate(values);
    }

    private TimelineCalendar CalendarFor(ReadOnlySpan<long> times)
    {
        if (_calendar is null || _calendar.StepCount != times.Length || !_calendar.HasTimes(times))
            _calendar = new TimelineCalendar(times);
        return _calendar;
    }
}
