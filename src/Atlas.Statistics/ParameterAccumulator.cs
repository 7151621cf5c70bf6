using System.Runtime.Intrinsics;

namespace Atlas.Statistics;

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
    private readonly Vector256<float>[] _thresholdVectors;
    private FixedBinHistogram[] _yearHistograms = [];
    private RunningMoments[] _slots = [];
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
        int lanes = Vector256<float>.Count;
        _thresholdVectors = new Vector256<float>[(_thresholds.Length + lanes - 1) / lanes];
        Span<float> lane = stackalloc float[lanes];
        for (int c = 0; c < _thresholdVectors.Length; c++)
        {
            for (int l = 0; l < lanes; l++)
            {
                int t = c * lanes + l;
                lane[l] = t < _thresholds.Length ? (float)_thresholds[t] : float.PositiveInfinity;
            }
            _thresholdVectors[c] = Vector256.Create<float>(lane);
        }
    }

    /// <summary>True when the parameter was accumulated for the current cell.</summary>
    public bool HasSeries { get; private set; }

    /// <summary>Sizes the per-slot and per-year stores for a calendar (allocating only when it changes shape).</summary>
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
        int chunks = _thresholdVectors.Length;
        Span<Vector256<int>> exceeding = stackalloc Vector256<int>[chunks];

        foreach (StepRun run in calendar.Runs)
        {
            FixedBinHistogram month = _monthHistograms[run.Slot % 12];
            FixedBinHistogram year = byYear ? _yearHistograms[run.Slot / 12] : month;
            int[] monthFine = month.Fine, monthCoarse = month.Coarse, yearFine = year.Fine, yearCoarse = year.Coarse;
            exceeding.Clear();
            long n = 0;
            double sum = 0, sumSquares = 0;
            float minimum = float.PositiveInfinity, maximum = float.NegativeInfinity;

            foreach (float x in values.Slice(run.Start, run.Length))
            {
                if (!(x >= lowest && x <= float.MaxValue)) continue;
                n++;
                double d = x - shift;
                sum += d;
                sumSquares += d * d;
                if (x < minimum) minimum = x;
                if (x > maximum) maximum = x;
                double position = x * inverseWidth;
                int bin = position >= lastBin ? lastBin : (int)position;
                monthFine[bin]++;
                monthCoarse[bin >> FixedBinHistogram.BlockShift]++;
                if (byYear)
                {
                    yearFine[bin]++;
                    yearCoarse[bin >> FixedBinHistogram.BlockShift]++;
                }
                if (chunks > 0)
                {
                    Vector256<float> value = Vector256.Create(x);
                    for (int c = 0; c < chunks; c++)
                        exceeding[c] -= Vector256.GreaterThan(value, _thresholdVectors[c]).AsInt32();
                }
            }
            if (n == 0) continue;

            _slots[run.Slot].AddSums(n, sum, sumSquares, minimum, maximum);
            int lowBin = month.BinOfValid(minimum), highBin = month.BinOfValid(maximum);
            month.Record(n, minimum, maximum, lowBin, highBin);
            if (byYear) year.Record(n, minimum, maximum, lowBin, highBin);
            int offset = run.Slot * _thresholds.Length;
            for (int t = 0; t < _thresholds.Length; t++)
                _slotExceedances[offset + t] += exceeding[t / Vector256<int>.Count][t % Vector256<int>.Count];
        }
    }

    /// <summary>The summary of a period of the current cell; <see cref="SummaryStatistics.Empty"/>-like when absent.</summary>
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
        FixedBinHistogram.EstimateQuantiles(HistogramsOf(period), Probabilities, quantiles);
        return new SummaryStatistics(moments.Mean, moments.PopulationStandardDeviation, moments.Minimum, moments.Maximum,
            quantiles[0], quantiles[1], quantiles[2], quantiles[3], n, coverage);
    }

    /// <summary>Exceedance fractions of a period at the accumulator's thresholds (NaN fractions when no step is valid).</summary>
    public ExceedanceFraction[] Exceedances(AtlasPeriod period, long validSteps)
    {
        var result = new ExceedanceFraction[_thresholds.Length];
        ReadOnlySpan<int> slots = HasSeries ? _calendar!.SlotsOf(period) : [];
        for (int t = 0; t < _thresholds.Length; t++)
        {
            long above = 0;
            foreach (int slot in slots) above += _slotExceedances[slot * _thresholds.Length + t];
            result[t] = new ExceedanceFraction(_thresholds[t], HasSeries && validSteps > 0 ? (double)above / validSteps : double.NaN);
        }
        return result;
    }

    /// <summary>Forgets the current cell, touching only what it used.</summary>
    public void Clear()
    {
        if (!HasSeries) return;
        HasSeries = false;
        foreach (FixedBinHistogram h in _monthHistograms) h.Clear();
        foreach (FixedBinHistogram h in _yearHistograms) h.Clear();
        Array.Clear(_slotExceedances);
    }

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
