using System.Runtime.CompilerServices;

namespace Atlas.Statistics.Calendar;

/// <summary>
/// The calendar structure of a timeline: which (year, month) each step falls in, the runs of consecutive steps in
/// the same month, the years present, and how many steps each period expects.
/// </summary>
/// <remarks>
/// <para>
/// Steps are grouped into slots, one per (year, month) from the first year to the last: slot = 12 (year - first
/// year) + month - 1. Every period is a union of slots, so statistics are accumulated per slot (or per calendar
/// month) and merged. Built once per dataset timeline; the steps need not be sorted (runs are then shorter).
/// </para>
/// <para>
/// Expected steps are counted against the calendar, not the timeline: a month expects its calendar length divided
/// by the nominal step (the most frequent interval between consecutive steps, rounded to whole steps), and every
/// month of the record's years counts, so the months before the record starts and after it ends are missing. A month
/// holding more steps than that (an irregular timeline) expects the steps it holds.
/// </para>
/// </remarks>
public sealed class TimelineCalendar
{
    private readonly long[] _times;
    private readonly int[] _stepSlots;
    private readonly StepRun[] _runs;
    private readonly long[] _slotSteps;
    private readonly long[] _slotExpected;
    private readonly long[] _monthExpected = new long[12];
    private readonly Dictionary<AtlasPeriod, int[]> _periodSlots = [];
    private readonly Dictionary<AtlasPeriod, long> _periodExpected = [];

    /// <summary>Builds the calendar of a timeline.</summary>
    /// <param name="unixSeconds">Time of each step, Unix seconds UTC.</param>
    /// <exception cref="ArgumentException">A time falls outside years 1000..9999; the message gives its index.</exception>
    public TimelineCalendar(ReadOnlySpan<long> unixSeconds)
    {
        _times = unixSeconds.ToArray();
        _stepSlots = new int[_times.Length];
        var yearMonth = new (int Year, int Month)[_times.Length];
        int firstYear = int.MaxValue, lastYear = int.MinValue;
        // Steps are converted to a calendar month once per month, not once per step: a step inside the month of the
        // previous one takes its year and month (decades of hourly steps would otherwise spend milliseconds here).
        long monthStart = long.MaxValue, monthEnd = long.MinValue;
        (int Year, int Month) current = default;
        for (int i = 0; i < _times.Length; i++)
        {
            if (_times[i] < monthStart || _times[i] >= monthEnd)
            {
                current = YearMonthOf(_times[i], i);
                var first = new DateTimeOffset(current.Year, current.Month, 1, 0, 0, 0, TimeSpan.Zero);
                monthStart = first.ToUnixTimeSeconds();
                monthEnd = first.AddMonths(1).ToUnixTimeSeconds();
            }
            (int year, int month) = current;
            yearMonth[i] = (year, month);
            firstYear = Math.Min(firstYear, year);
            lastYear = Math.Max(lastYear, year);
        }
        FirstYear = _times.Length == 0 ? 0 : firstYear;
        YearSpan = _times.Length == 0 ? 0 : lastYear - firstYear + 1;
        _slotSteps = new long[12 * YearSpan];

        var runs = new List<StepRun>();
        int runStart = 0;
        for (int i = 0; i < _times.Length; i++)
        {
            int slot = 12 * (yearMonth[i].Year - FirstYear) + yearMonth[i].Month - 1;
            _stepSlots[i] = slot;
            _slotSteps[slot]++;
            if (i > 0 && slot != _stepSlots[i - 1])
            {
                runs.Add(new StepRun(runStart, i - runStart, _stepSlots[i - 1]));
                runStart = i;
            }
        }
        if (_times.Length > 0) runs.Add(new StepRun(runStart, _times.Length - runStart, _stepSlots[^1]));
        _runs = [.. runs];

        NominalStepSeconds = ModalInterval(_times);
        _slotExpected = new long[_slotSteps.Length];
        for (int slot = 0; slot < _slotSteps.Length; slot++)
        {
            long calendar = ExpectedInMonth(FirstYear + slot / 12, slot % 12 + 1);
            _slotExpected[slot] = Math.Max(calendar, _slotSteps[slot]);
            _monthExpected[slot % 12] += _slotExpected[slot];
        }

        var years = new List<int>();
        for (int y = 0; y < YearSpan; y++)
            if (_slotSteps.AsSpan(12 * y, 12).ContainsAnyExcept(0L)) years.Add(FirstYear + y);
        Years = years;

        var present = new List<AtlasPeriod>();
        foreach (AtlasPeriod p in AtlasPeriod.StandardPeriods.Concat(years.Select(AtlasPeriod.Year)))
        {
            int[] slots = Enumerable.Range(0, _slotSteps.Length).Where(s => _slotSteps[s] > 0 && p.Contains(FirstYear + s / 12, s % 12 + 1)).ToArray();
            if (slots.Length == 0) continue;
            _periodSlots[p] = slots;
            present.Add(p);
        }
        PeriodsPresent = present;
        foreach (AtlasPeriod p in present) _periodExpected[p] = CountExpected(p);
    }

    /// <summary>Number of steps.</summary>
    public int StepCount => _times.Length;

    /// <summary>Earliest year of the timeline (0 when empty).</summary>
    public int FirstYear { get; }

    /// <summary>Years from the first to the last, inclusive (0 when empty).</summary>
    public int YearSpan { get; }

    /// <summary>Number of (year, month) slots: 12 x <see cref="YearSpan"/>.</summary>
    public int SlotCount => _slotSteps.Length;

    /// <summary>Years with at least one step, ascending.</summary>
    public IReadOnlyList<int> Years { get; }

    /// <summary>Periods with at least one step: the standard ones in their order, then each year.</summary>
    public IReadOnlyList<AtlasPeriod> PeriodsPresent { get; }

    /// <summary>The slot of a calendar year and month (1 = January).</summary>
    public int SlotOf(int year, int month) => 12 * (year - FirstYear) + month - 1;

    /// <summary>The calendar year of a slot.</summary>
    public int YearOfSlot(int slot) => FirstYear + slot / 12;

    /// <summary>The calendar month (1 = January) of a slot.</summary>
    public static int MonthOfSlot(int slot) => slot % 12 + 1;

    /// <summary>
    /// The nominal step, s: the most frequent interval between consecutive steps (the shorter one on a tie); one hour
    /// when the timeline has fewer than two steps.
    /// </summary>
    public long NominalStepSeconds { get; }

    /// <summary>
    /// Steps the period expects: the calendar length of its months within the record's years over the nominal step
    /// (see remarks); 0 when the timeline is empty.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public long ExpectedSteps(AtlasPeriod period) =>
        _periodExpected.TryGetValue(period, out long n) ? n : CountExpected(period);

    // Counted once per period present when the calendar is built: the layer pass asks for every period of every cell.
    private long CountExpected(AtlasPeriod period)
    {
        long n = 0;
        for (int slot = 0; slot < _slotExpected.Length; slot++)
            if (period.Contains(FirstYear + slot / 12, slot % 12 + 1)) n += _slotExpected[slot];
        return n;
    }

    /// <summary>Steps a slot expects (its calendar length over the nominal step, or the steps it holds when more).</summary>
    public long ExpectedInSlot(int slot) => _slotExpected[slot];

    /// <summary>Steps each calendar month (index 0 = January) of a period expects over the record's years (0 for the months it lacks).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public void ExpectedByMonth(AtlasPeriod period, Span<long> expected)
    {
        expected[..12].Clear();
        if (period.Kind == PeriodKind.Year)
        {
            for (int month = 1; month <= 12; month++)
                if (period.Code >= FirstYear && period.Code < FirstYear + YearSpan) expected[month - 1] = _slotExpected[SlotOf(period.Code, month)];
            return;
        }
        foreach (int month in period.Months) expected[month - 1] = _monthExpected[month - 1];
    }

    /// <summary>Steps any calendar month expects at the nominal step, also outside the record (a winter's December before it starts).</summary>
    public long ExpectedInMonth(int year, int month)
    {
        if (year < AtlasPeriod.FirstYear || year > AtlasPeriod.LastYear || _times.Length == 0) return 0;
        var first = new DateTimeOffset(year, month, 1, 0, 0, 0, TimeSpan.Zero);
        long seconds = (long)(first.AddMonths(1) - first).TotalSeconds;
        return (seconds + NominalStepSeconds / 2) / NominalStepSeconds;
    }

    /// <summary>Steps of the timeline in a slot.</summary>
    public long StepsInSlot(int slot) => _slotSteps[slot];

    /// <summary>The slots (with steps) that make up a period, ascending; empty when it has none.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public ReadOnlySpan<int> SlotsOf(AtlasPeriod period) => _periodSlots.TryGetValue(period, out int[]? slots) ? slots : [];

    /// <summary>The slot of each step.</summary>
    public ReadOnlySpan<int> StepSlots => _stepSlots;

    /// <summary>Runs of consecutive steps in the same slot, in step order.</summary>
    internal ReadOnlySpan<StepRun> Runs => _runs;

    /// <summary>True when the timeline is exactly this one (so a calendar can be reused from cell to cell).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public bool HasTimes(ReadOnlySpan<long> unixSeconds) => unixSeconds.SequenceEqual(_times);

    private static long ModalInterval(long[] times)
    {
        if (times.Length < 2) return 3600;
        var counts = new Dictionary<long, int>();
        long previous = times[0];
        for (int i = 1; i < times.Length; i++)
        {
            long interval = times[i] - previous;
            previous = times[i];
            if (interval <= 0) continue;
            counts[interval] = counts.GetValueOrDefault(interval) + 1;
        }
        if (counts.Count == 0) return 3600;
        long best = 0;
        int bestCount = 0;
        foreach ((long interval, int count) in counts)
            if (count > bestCount || (count == bestCount && interval < best)) { best = interval; bestCount = count; }
        return best;
    }

    private static (int Year, int Month) YearMonthOf(long unixSeconds, int index)
    {
        const long first = -30610224000L; // 1000-01-01T00:00:00Z
        const long end = 253402300800L;   // 10000-01-01T00:00:00Z
        if (unixSeconds < first || unixSeconds >= end)
            throw new ArgumentException($"CellSeries.Times[{index}] = {unixSeconds} s is outside the years {AtlasPeriod.FirstYear}..{AtlasPeriod.LastYear}.", "series");
        DateTime t = DateTimeOffset.FromUnixTimeSeconds(unixSeconds).UtcDateTime;
        return (t.Year, t.Month);
    }
}

/// <summary>Consecutive steps Start .. Start + Length - 1, all in one (year, month) slot.</summary>
internal readonly record struct StepRun(int Start, int Length, int Slot);
