using System.Runtime.CompilerServices;

namespace Atlas.Statistics.Directions;

/// <summary>
/// The streaming accumulator of power-weighted direction per (year, month) slot: sums of J, J cos theta, J sin theta
/// and J per rose sector over the steps with both power and direction.
/// </summary>
internal sealed class DirectionAccumulator
{
    private const int Sectors = DirectionStatistics.Sectors;
    private double[] _sums = [];       // per slot: weight, weight x cos, weight x sin
    private long[] _counts = [];
    private double[] _sectorSums = []; // per slot and sector
    private TimelineCalendar? _calendar;

    public bool HasSeries { get; private set; }

    public void Prepare(TimelineCalendar calendar)
    {
        if (ReferenceEquals(calendar, _calendar)) return;
        _calendar = calendar;
        _sums = new double[3 * calendar.SlotCount];
        _counts = new long[calendar.SlotCount];
        _sectorSums = new double[Sectors * calendar.SlotCount];
    }

    /// <summary>One pass over direction (degrees from) and power (kW/m) of the current cell.</summary>
    /// <param name="includedSlots">When given, only the steps of the slots marked true are read (the others are never summarised).</param>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public void Accumulate(ReadOnlySpan<float> directionDegrees, ReadOnlySpan<float> power, ReadOnlySpan<bool> includedSlots = default)
    {
        TimelineCalendar calendar = _calendar ?? throw new InvalidOperationException("Prepare the accumulator for a calendar first.");
        HasSeries = true;
        foreach (StepRun run in calendar.Runs)
        {
            // A slot outside the caller's window is never summarised: its sums stay zero.
            if (!includedSlots.IsEmpty && !includedSlots[run.Slot]) continue;
            double weight = 0, cosine = 0, sine = 0;
            long n = 0;
            Span<double> sectors = _sectorSums.AsSpan(run.Slot * Sectors, Sectors);
            int end = run.Start + run.Length;
            for (int i = run.Start; i < end; i++)
            {
                float j = power[i], theta = directionDegrees[i];
                if (!(j >= 0 && j <= float.MaxValue) || !float.IsFinite(theta)) continue;
                CompassTable.Lookup(theta, out double cos, out double sin, out int sector);
                n++;
                weight += j;
                cosine += j * cos;
                sine += j * sin;
                sectors[sector] += j;
            }
            _counts[run.Slot] += n;
            _sums[3 * run.Slot] += weight;
            _sums[3 * run.Slot + 1] += cosine;
            _sums[3 * run.Slot + 2] += sine;
        }
    }

    /// <summary>
    /// The statistics over a set of slots (a period restricted to a window, in the point analysis), each calendar
    /// month weighted by <see cref="MonthBalance"/> when <paramref name="balanced"/>.
    /// </summary>
    public DirectionStatistics Summarise(ReadOnlySpan<int> slots, long expectedSteps, ReadOnlySpan<long> expectedByMonth, bool balanced)
    {
        Span<double> rose = stackalloc double[Sectors];
        return SummariseInto(slots, expectedSteps, expectedByMonth, balanced, rose).ToStatistics(rose);
    }

    /// <summary>
    /// <see cref="Summarise"/> without allocating: the power rose goes into <paramref name="rose"/> (<see cref="Sectors"/>
    /// values, written only when <see cref="DirectionSummary.HasRose"/>).
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public DirectionSummary SummariseInto(ReadOnlySpan<int> slots, long expectedSteps, ReadOnlySpan<long> expectedByMonth, bool balanced, Span<double> rose)
    {
        if (!HasSeries) return DirectionSummary.Empty;
        double weight = 0, cosine = 0, sine = 0;
        Span<double> weights = stackalloc double[12];
        bool weighted = MonthBalance.TryWeightsOfSlots(slots, _counts, expectedByMonth, balanced, weights, out long n);
        Span<double> sectors = stackalloc double[Sectors];
        foreach (int slot in slots)
        {
            double w = weighted ? weights[slot % 12] : 1;
            weight += w * _sums[3 * slot];
            cosine += w * _sums[3 * slot + 1];
            sine += w * _sums[3 * slot + 2];
            for (int k = 0; k < Sectors; k++) sectors[k] += w * _sectorSums[slot * Sectors + k];
        }
        double coverage = expectedSteps > 0 ? (double)n / expectedSteps : 0;
        if (n == 0 || !(weight > 0))
            return DirectionSummary.Empty with { Count = n, Coverage = coverage };
        for (int k = 0; k < Sectors; k++) rose[k] = sectors[k] / weight;
        return new DirectionSummary(CircularStatistics.MeanFromSums(cosine, sine), CircularStatistics.SpreadFromSums(weight, cosine, sine),
            n, coverage, HasRose: true);
    }

    public void Clear()
    {
        if (!HasSeries) return;
        HasSeries = false;
        Array.Clear(_sums);
        Array.Clear(_counts);
        Array.Clear(_sectorSums);
    }
}
