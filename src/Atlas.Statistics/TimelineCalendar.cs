namespace Atlas.Statistics;

/// <summary>
/// The calendar structure of a timeline: which (year, month) each step falls in, the runs of consecutive steps in
/// the same month, the years present, and how many steps each period expects.
/// </summary>
/// <remarks>
/// Steps are grouped into slots, one per (year, month) from the first year to the last: slot = 12 (year - first
/// year) + month - 1. Every period is a union of slots, so statistics are accumulated per slot (or per calendar
/// month) and merged. Built once per dataset timeline; the steps need not be sorted (runs are then shorter).
/// </remarks>
public sealed class TimelineCalendar
{
    private readonly long[] _times;
    private readonly int[] _stepSlots;
    private readonly StepRun[] _runs;
    private readonly long[] _slotSteps;
    private readonly Dictionary<AtlasPeriod, int[]> _periodSlots = [];

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

    /// <summary>Steps of the timeline in the period (0 when it has none).</summary>
    public long ExpectedSteps(AtlasPeriod period)
    {
        long n = 0;
        foreach (int s in SlotsOf(period)) n += _slotSteps[s];
        return n;
    }

    /// <summary>Steps of the timeline in a slot.</summary>
    public long StepsInSlot(int slot) => _slotSteps[slot];

    /// <summary>The slots (with steps) that make up a period, ascending; empty when it has none.</summary>
    public ReadOnlySpan<int> SlotsOf(AtlasPeriod period) => _periodSlots.TryGetValue(period, out int[]? slots) ? slots : [];

    /// <summary>The slot of each step.</summary>
    public ReadOnlySpan<int> StepSlots => _stepSlots;

    /// <summary>Runs of consecutive steps in the same slot, in step order.</summary>
    internal ReadOnlySpan<StepRun> Runs => _runs;

    /// <summary>True when the timeline is exactly this one (so a calendar can be reused from cell to cell).</summary>
    public bool HasTimes(ReadOnlySpan<long> unixSeconds) => unixSeconds.SequenceEqual(_times);

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
