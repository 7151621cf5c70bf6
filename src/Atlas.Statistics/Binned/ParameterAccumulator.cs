using System.Runtime.CompilerServices;

namespace Atlas.Statistics.Binned;

/// <summary>
/// The streaming accumulator of one parameter in the layer pass: moments per (year, month) slot, a histogram per
/// calendar month and (with more than one year) per year, and exceedance counts per slot. Periods are then
/// merged from slots and histograms, never re-read from the series. Reused from cell to cell without allocating.
/// </summary>
internal sealed class ParameterAccumulator
{
    private readonly float _lowest;
    private readonly HistogramBinning _binning;
    private readonly FixedBinHistogram[] _monthHistograms = new FixedBinHistogram[12];
    private readonly FixedBinHistogram[] _parts = new FixedBinHistogram[12];
    private readonly double[] _thresholds;
    private readonly float[] _singleThresholds;
    // Scratch of one group of runs read side by side (RunTally), reused from cell to cell.
    private int[] _bins = [];
    private double[] _offsets = [];
    private readonly int[][] _laneFine = new int[RunTally.Lanes][];
    private readonly int[]?[] _laneAlsoFine = new int[]?[RunTally.Lanes];
    private FixedBinHistogram[] _yearHistograms = [];
    private RunningMoments[] _slots = [];
    private readonly RunningMoments[] _monthMoments = new RunningMoments[12];
    private long[] _slotExceedances = [];
    private TimelineCalendar? _calendar;
    private double _shift;

    private static readonly double[] Probabilities = [.. StatisticKindNames.Percentiles.Select(p => p.Probability)];

    public ParameterAccumulator(WaveParameter parameter, HistogramBinning binning, IReadOnlyList<double> thresholds)
    {
        _lowest = ParameterValidity.Lowest(parameter);
        _binning = binning;
        for (int m = 0; m < 12; m++) _monthHistograms[m] = new FixedBinHistogram(binning);
        _thresholds = [.. thresholds];
        // Thresholds are compared in single precision, like the stored values: a stored 3.0 is not above 3 m.
        _singleThresholds = [.. _thresholds.Select(t => (float)t)];
    }

    /// <summary>True when the parameter was accumulated for the current cell.</summary>
    public bool HasSeries { get; private set; }

    /// <summary>Sizes the per-slot and per-year stores for a calendar (allocating only when it changes shape).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public void Prepare(TimelineCalendar calendar)
    {
        if (ReferenceEquals(calendar, _calendar)) return;
        _calendar = calendar;
        if (_slots.Length != calendar.SlotCount)
        {
            _slots = new RunningMoments[calendar.SlotCount];
            _slotExceedances = new long[calendar.SlotCount * _thresholds.Length];
        }
        int years = calendar.YearSpan > 1 ? calendar.YearSpan : 0;
        if (_yearHistograms.Length != years)
        {
            _yearHistograms = new FixedBinHistogram[years];
            for (int y = 0; y < years; y++) _yearHistograms[y] = new FixedBinHistogram(_binning);
        }
    }

    /// <summary>One pass over the series of the current cell.</summary>
    /// <remarks>
    /// Runs of steps in one slot are read four at a time: each by <see cref="RunScan"/> (validity, extremes, bins,
    /// exceedances, in whole vectors), then side by side by <see cref="RunTally"/> for the sums, in step order so that
    /// they hold the same bits as a plain loop over each run, and for the fine bins of the histograms; the histograms'
    /// block counts are taken from their fine bins at the end.
    /// </remarks>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public void Accumulate(ReadOnlySpan<float> values)
    {
        TimelineCalendar calendar = _calendar ?? throw new InvalidOperationException("Prepare the accumulator for a calendar first.");
        HasSeries = true;
        float lowest = _lowest;
        _shift = 0;
        foreach (float v in values)
            if (v >= lowest && v <= float.MaxValue) { _shift = v; break; }
        double shift = _shift;
        Array.Fill(_slots, new RunningMoments(shift));

        double inverseWidth = _monthHistograms[0].InverseWidth;
        int lastBin = _monthHistograms[0].LastBin;
        bool byYear = _yearHistograms.Length > 0;
        int thresholds = _thresholds.Length;
        const int lanes = RunTally.Lanes;
        Span<long> exceeding = stackalloc long[lanes * thresholds];
        Span<RunExtent> extents = stackalloc RunExtent[lanes];
        Span<double> sums = stackalloc double[2 * lanes];
        int[][] fine = _laneFine;
        int[]?[] alsoFine = _laneAlsoFine;

        ReadOnlySpan<StepRun> runs = calendar.Runs;
        for (int first = 0; first < runs.Length; first += lanes)
        {
            ReadOnlySpan<StepRun> group = runs.Slice(first, Math.Min(lanes, runs.Length - first));
            int stride = 0;
            foreach (StepRun run in group) stride = Math.Max(stride, run.Length);
            if (_bins.Length < lanes * stride)
            {
                _bins = new int[lanes * stride];
                _offsets = new double[lanes * stride];
            }
            exceeding.Clear();
            for (int r = 0; r < lanes; r++)
            {
                Span<int> bins = _bins.AsSpan(r * stride, stride);
                Span<double> offsets = _offsets.AsSpan(r * stride, stride);
                int length = 0;
                if (r < group.Length)
                {
                    StepRun run = group[r];
                    length = run.Length;
                    extents[r] = RunScan.Scan(values.Slice(run.Start, length), lowest, shift, inverseWidth, lastBin, _singleThresholds,
                        exceeding.Slice(r * thresholds, thresholds), bins, offsets);
                    fine[r] = _monthHistograms[run.Slot % 12].Fine;
                    alsoFine[r] = byYear ? _yearHistograms[run.Slot / 12].Fine : null;
                }
                else
                {
                    // A lane without a run (the last group) is all padding: its counts are never touched.
                    fine[r] = fine[0];
                    alsoFine[r] = alsoFine[0];
                }
                bins[length..].Fill(RunScan.MissingBin);
                offsets[length..].Clear();
            }
            RunTally.Tally(_offsets, _bins, stride, fine, alsoFine, sums);

            for (int r = 0; r < group.Length; r++)
            {
                RunExtent extent = extents[r];
                if (extent.Count == 0) continue;
                StepRun run = group[r];
                _slots[run.Slot].AddSums(extent.Count, sums[2 * r], sums[2 * r + 1], extent.Minimum, extent.Maximum);
                FixedBinHistogram month = _monthHistograms[run.Slot % 12];
                int lowBin = month.BinOfValid(extent.Minimum), highBin = month.BinOfValid(extent.Maximum);
                month.Record(extent.Count, extent.Minimum, extent.Maximum, lowBin, highBin);
                if (byYear) _yearHistograms[run.Slot / 12].Record(extent.Count, extent.Minimum, extent.Maximum, lowBin, highBin);
                int offset = run.Slot * thresholds;
                for (int t = 0; t < thresholds; t++) _slotExceedances[offset + t] += exceeding[r * thresholds + t];
            }
        }
        foreach (FixedBinHistogram h in _monthHistograms) h.CountBlocks();
        foreach (FixedBinHistogram h in _yearHistograms) h.CountBlocks();
    }

    /// <summary>
    /// The summary of a period of the current cell; <see cref="SummaryStatistics.Empty"/>-like when absent. Seasons and
    /// the annual period are month-balanced (<see cref="MonthBalance"/>): the mean is the expected-step-weighted mean
    /// of the monthly means, the deviation that of the weighted mixture, the percentiles weighted histogram estimates.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public SummaryStatistics Summarise(AtlasPeriod period, long expectedSteps)
    {
        TimelineCalendar calendar = _calendar!;
        if (!HasSeries) return SummaryStatistics.Empty;
        var moments = new RunningMoments(_shift);
        foreach (int slot in calendar.SlotsOf(period)) moments.Merge(_slots[slot]);
        long n = moments.Count;
        double coverage = expectedSteps > 0 ? (double)n / expectedSteps : 0;
        if (n == 0) return SummaryStatistics.Empty with { Coverage = coverage };

        Span<double> quantiles = stackalloc double[Probabilities.Length];
        Span<double> weights = stackalloc double[12];
        if (MonthBalance.Applies(period) && BalanceWeights(period, weights, out RunningMoments[] months))
        {
            double weightSum = 0, weightedMean = 0;
            for (int m = 0; m < 12; m++)
            {
                if (weights[m] == 0) continue;
                double share = weights[m] * months[m].Count;
                weightSum += share;
                weightedMean += share * months[m].Mean;
            }
            weightedMean /= weightSum;
            double variance = 0;
            for (int m = 0; m < 12; m++)
            {
                if (weights[m] == 0) continue;
                double share = weights[m] * months[m].Count, offset = months[m].Mean - weightedMean;
                variance += share * (months[m].PopulationVariance + offset * offset);
            }
            ReadOnlySpan<FixedBinHistogram> parts = HistogramsOf(period);
            Span<double> partWeights = stackalloc double[parts.Length];
            IReadOnlyList<int> periodMonths = period.Months;
            for (int i = 0; i < parts.Length; i++) partWeights[i] = weights[periodMonths[i] - 1];
            FixedBinHistogram.EstimateWeightedQuantiles(parts, partWeights, Probabilities, quantiles);
            return new SummaryStatistics(weightedMean, Math.Sqrt(variance / weightSum), moments.Minimum, moments.Maximum,
                quantiles[0], quantiles[1], quantiles[2], quantiles[3], n, coverage);
        }

        FixedBinHistogram.EstimateQuantiles(HistogramsOf(period), Probabilities, quantiles);
        return new SummaryStatistics(moments.Mean, moments.PopulationStandardDeviation, moments.Minimum, moments.Maximum,
            quantiles[0], quantiles[1], quantiles[2], quantiles[3], n, coverage);
    }

    /// <summary>The thresholds, in the order of the fractions.</summary>
    public ReadOnlySpan<double> Thresholds => _thresholds;

    /// <summary>
    /// Exceedance fractions of a period at the accumulator's thresholds, one per threshold into <paramref name="fractions"/>
    /// (NaN when no step is valid); month-balanced for seasons and the annual period, as <see cref="Summarise"/>.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public void ExceedancesInto(AtlasPeriod period, long validSteps, Span<double> fractions)
    {
        ReadOnlySpan<int> slots = HasSeries ? _calendar!.SlotsOf(period) : [];
        Span<double> weights = stackalloc double[12];
        bool balanced = HasSeries && validSteps > 0 && MonthBalance.Applies(period) && BalanceWeights(period, weights, out _);
        double weightSum = 0;
        if (balanced)
            foreach (int slot in slots) weightSum += weights[slot % 12] * _slots[slot].Count;
        for (int t = 0; t < _thresholds.Length; t++)
        {
            double above = 0;
            foreach (int slot in slots)
            {
                long count = _slotExceedances[slot * _thresholds.Length + t];
                above += balanced ? weights[slot % 12] * count : count;
            }
            fractions[t] = !HasSeries || validSteps <= 0 ? double.NaN : balanced ? above / weightSum : above / validSteps;
        }
    }

    /// <summary>The month weights of a climatological period and its moments per calendar month; false when they are equal.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private bool BalanceWeights(AtlasPeriod period, Span<double> weights, out RunningMoments[] months)
    {
        TimelineCalendar calendar = _calendar!;
        months = _monthMoments;
        for (int m = 0; m < 12; m++) months[m] = new RunningMoments(_shift);
        foreach (int slot in calendar.SlotsOf(period)) months[slot % 12].Merge(_slots[slot]);
        Span<long> expected = stackalloc long[12], valid = stackalloc long[12];
        calendar.ExpectedByMonth(period, expected);
        for (int m = 0; m < 12; m++) valid[m] = months[m].Count;
        return MonthBalance.TryWeights(expected, valid, weights);
    }

    /// <summary>Forgets the current cell, touching only what it used.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public void Clear()
    {
        if (!HasSeries) return;
        HasSeries = false;
        foreach (FixedBinHistogram h in _monthHistograms) h.Clear();
        foreach (FixedBinHistogram h in _yearHistograms) h.Clear();
        Array.Clear(_slotExceedances);
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private ReadOnlySpan<FixedBinHistogram> HistogramsOf(AtlasPeriod period)
    {
        switch (period.Kind)
        {
            case PeriodKind.Year when _yearHistograms.Length > 0:
                return new ReadOnlySpan<FixedBinHistogram>(in _yearHistograms[period.Code - _calendar!.FirstYear]);
            case PeriodKind.Month:
                return new ReadOnlySpan<FixedBinHistogram>(in _monthHistograms[period.Code - 1]);
            default:
                IReadOnlyList<int> months = period.Months;
                for (int i = 0; i < months.Count; i++) _parts[i] = _monthHistograms[months[i] - 1];
                return _parts.AsSpan(0, months.Count);
        }
    }
}
