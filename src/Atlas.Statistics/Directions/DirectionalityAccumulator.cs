using Atlas.WavePhysics;
using System.Runtime.CompilerServices;

namespace Atlas.Statistics.Directions;

/// <summary>
/// The streaming accumulator of the period directionality coefficient (IEC TS 62600-101): per (year, month) slot, the
/// circular harmonics of the power-weighted directional distribution of every step with power, mean direction and
/// spread (<see cref="DirectionalHarmonics"/>, cosine-2s spreading about the mean direction). A period's J_theta is
/// the merge of its slots' sums, evaluated once: d = max over theta of mean J_theta over mean J, with the direction
/// of that maximum (waves coming from). Seasons and the annual period are month-balanced like every other statistic.
/// </summary>
internal sealed class DirectionalityAccumulator
{
    // Per slot the sums in the wide layout of HarmonicAccumulator (vectorised over the orders).
    private const int Width = DirectionalHarmonics.WideLength;
    private double[] _sums = [];
    private long[] _counts = [];
    private TimelineCalendar? _calendar;
    private readonly double[] _merged = new double[DirectionalHarmonics.SumLength];

    public bool HasSeries { get; private set; }

    public void Prepare(TimelineCalendar calendar)
    {
        if (ReferenceEquals(calendar, _calendar)) return;
        _calendar = calendar;
        _sums = new double[Width * calendar.SlotCount];
        _counts = new long[calendar.SlotCount];
    }

    /// <summary>One pass over the mean direction (degrees from), spread (degrees) and power (kW/m) of the current cell.</summary>
    /// <param name="includedSlots">When given, only the steps of the slots marked true are read (the others are never summarised).</param>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public void Accumulate(ReadOnlySpan<float> directionDegrees, ReadOnlySpan<float> spreadDegrees, ReadOnlySpan<float> power, ReadOnlySpan<bool> includedSlots = default)
    {
        TimelineCalendar calendar = _calendar ?? throw new InvalidOperationException("Prepare the accumulator for a calendar first.");
        HasSeries = true;
        foreach (StepRun run in calendar.Runs)
        {
            // A slot outside the caller's window is never summarised: its sums stay zero.
            if (!includedSlots.IsEmpty && !includedSlots[run.Slot]) continue;
            var harmonics = new HarmonicAccumulator();
            long n = 0;
            int end = run.Start + run.Length;
            for (int i = run.Start; i < end; i++)
            {
                float j = power[i], theta = directionDegrees[i], spread = spreadDegrees[i];
                if (!(j >= 0 && j <= float.MaxValue) || !float.IsFinite(theta) || !(spread >= 0 && spread <= float.MaxValue)) continue;
                CompassTable.Lookup(theta, out double cos, out double sin, out _);
                harmonics.Add(j, cos, sin, spread);
                n++;
            }
            harmonics.MoveTo(_sums.AsSpan(run.Slot * Width, Width));
            _counts[run.Slot] += n;
        }
    }

    /// <summary>
    /// The directionality over a set of slots: the slots' harmonic sums merged (each calendar month weighted by
    /// <see cref="MonthBalance"/> when <paramref name="balanced"/>), J_theta maximised over theta.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public PeriodDirectionality Summarise(ReadOnlySpan<int> slots, long expectedSteps, ReadOnlySpan<long> expectedByMonth, bool balanced)
    {
        if (!HasSeries) return PeriodDirectionality.Empty;
        Span<double> weights = stackalloc double[12];
        bool weighted = MonthBalance.TryWeightsOfSlots(slots, _counts, expectedByMonth, balanced, weights, out long n);
        double coverage = expectedSteps > 0 ? (double)n / expectedSteps : 0;
        if (n == 0) return PeriodDirectionality.Empty with { Coverage = coverage };
        Span<double> merged = _merged;
        merged.Clear();
        foreach (int slot in slots)
            DirectionalHarmonics.WideToSums(_sums.AsSpan(slot * Width, Width), weighted ? weights[slot % 12] : 1, merged);
        DirectionalPower maximum = DirectionalHarmonics.Maximum(merged);
        return new PeriodDirectionality(maximum.Coefficient, maximum.DirectionOfMaximumDegrees, n, coverage);
    }

    public void Clear()
    {
        if (!HasSeries) return;
        HasSeries = false;
        Array.Clear(_sums);
        Array.Clear(_counts);
    }
}

/// <summary>The period directionality coefficient, the direction of the largest resolved power, and the steps behind them.</summary>
internal readonly record struct PeriodDirectionality(double Coefficient, double MaxPowerFromDegrees, long Count, double Coverage)
{
    public static PeriodDirectionality Empty { get; } = new(double.NaN, double.NaN, 0, 0);

    /// <summary>As a summary: the coefficient as its mean, with count and coverage; the other statistics have no meaning for it.</summary>
    public SummaryStatistics AsSummary() => SummaryStatistics.Empty with { Mean = Coefficient, Count = Count, Coverage = Coverage };
}
