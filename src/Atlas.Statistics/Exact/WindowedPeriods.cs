using System.Buffers;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;

namespace Atlas.Statistics.Exact;

/// <summary>The periods present in a point analysis window, the slots of each, and the sorted values of a parameter per period.</summary>
internal sealed class WindowedPeriods
{
    private readonly bool[] _included;
    // Every slot inside the window belongs to four periods: its month, its season, its year and the whole window
    // (annual). The first three by slot (-1 outside the window); annual holds every slot.
    private readonly int[] _monthOfSlot, _seasonOfSlot, _yearOfSlot;
    private readonly int _annual = -1;

    public WindowedPeriods(TimelineCalendar calendar, AnalysisWindow? window)
    {
        Calendar = calendar;
        Window = window;
        _included = new bool[calendar.SlotCount];
        // Every month of the record's years inside the window is included, with or without steps: the months without
        // any are missing, and count as expected (calendar-true coverage).
        for (int s = 0; s < _included.Length; s++)
        {
            _included[s] = window?.Contains(calendar.YearOfSlot(s), TimelineCalendar.MonthOfSlot(s)) ?? true;
            if (_included[s]) StepsInWindow += calendar.StepsInSlot(s);
        }

        var periods = new List<WindowPeriod>();
        _monthOfSlot = new int[calendar.SlotCount];
        _seasonOfSlot = new int[calendar.SlotCount];
        _yearOfSlot = new int[calendar.SlotCount];
        Array.Fill(_monthOfSlot, -1);
        Array.Fill(_seasonOfSlot, -1);
        Array.Fill(_yearOfSlot, -1);
        foreach (AtlasPeriod period in calendar.PeriodsPresent)
        {
            int[] slots = [.. calendar.SlotsOf(period).ToArray().Where(s => _included[s])];
            if (slots.Length == 0) continue;
            var expectedByMonth = new long[12];
            for (int s = 0; s < _included.Length; s++)
                if (_included[s] && period.Contains(calendar.YearOfSlot(s), TimelineCalendar.MonthOfSlot(s)))
                    expectedByMonth[s % 12] += calendar.ExpectedInSlot(s);
            long expected = expectedByMonth.Sum();
            int[]? ofSlot = period.Kind switch
            {
                PeriodKind.Month => _monthOfSlot,
                PeriodKind.Season => _seasonOfSlot,
                PeriodKind.Year => _yearOfSlot,
                _ => null,
            };
            if (ofSlot is null) _annual = periods.Count;
            else foreach (int s in slots) ofSlot[s] = periods.Count;
            periods.Add(new WindowPeriod(period, slots, expected, expectedByMonth));
        }
        Periods = periods;
        for (int s = 0; s < _included.Length; s++)
            if (_included[s] && calendar.StepsInSlot(s) > 0 && (_annual < 0 || _monthOfSlot[s] < 0 || _seasonOfSlot[s] < 0 || _yearOfSlot[s] < 0))
                throw new InvalidOperationException($"Slot {s} of the window lacks its month, season, year or annual period.");
    }

    public TimelineCalendar Calendar { get; }

    /// <summary>The window, or null for the whole record.</summary>
    public AnalysisWindow? Window { get; }

    public long StepsInWindow { get; }

    public IReadOnlyList<WindowPeriod> Periods { get; }

    /// <summary>Per slot, true when it is inside the window.</summary>
    public ReadOnlySpan<bool> IncludedSlots => _included;

    /// <summary>True when the slot is inside the window (it may hold no step: a missing month).</summary>
    public bool Includes(int slot) => _included[slot];

    public int IndexOf(AtlasPeriod period)
    {
        for (int i = 0; i < Periods.Count; i++) if (Periods[i].Period == period) return i;
        return -1;
    }

    /// <summary>
    /// The valid values inside the window sorted and dealt out, still sorted, to every period they belong to; null
    /// when the series is absent. <paramref name="sums"/>, when given, also receives the count and sum of the same
    /// values per slot (read in step order), sparing the inter-annual means a pass of their own.
    /// </summary>
    /// <remarks>
    /// Each value is packed into one 64-bit key with its slot (value bits above, slot below). Every parameter sorted
    /// here is non-negative, and the bits of a non-negative float order like the float, so sorting the keys by their
    /// upper half orders the values and carries their slots along. The keys live in arrays rented for the call.
    /// </remarks>
    public SortedPeriodValues? SortPerPeriod(ReadOnlySpan<float> values, WaveParameter parameter, SlotSums? sums)
    {
        if (values.Length == 0) return null;
        long[] keys = ArrayPool<long>.Shared.Rent(values.Length), buffer = ArrayPool<long>.Shared.Rent(values.Length);
        try
        {
            var slotCounts = new int[_included.Length];
            int count = Pack(values, parameter, keys, slotCounts, sums);
            ValueRadixSort.SortByUpperHalf(keys.AsSpan(0, count), buffer);
            return Deal(keys.AsSpan(0, count), slotCounts);
        }
        finally
        {
            ArrayPool<long>.Shared.Return(keys);
            ArrayPool<long>.Shared.Return(buffer);
        }
    }

    /// <summary>
    /// The count and sum per slot of the valid values inside the window (in step order, as <see cref="SortPerPeriod"/>
    /// adds them), for a parameter whose period summaries were not asked for.
    /// </summary>
    public void SumPerSlot(ReadOnlySpan<float> values, WaveParameter parameter, SlotSums sums)
    {
        ReadOnlySpan<int> stepSlots = Calendar.StepSlots;
        for (int i = 0; i < values.Length; i++)
        {
            int slot = stepSlots[i];
            if (_included[slot] && ParameterValidity.IsValid(parameter, values[i])) sums.Add(slot, values[i]);
        }
    }

    private int Pack(ReadOnlySpan<float> values, WaveParameter parameter, Span<long> keys, Span<int> slotCounts, SlotSums? sums)
    {
        int count = 0;
        // Run by run (consecutive steps of one slot, in step order): the slots outside the window are stepped over whole.
        foreach (StepRun run in Calendar.Runs)
        {
            int slot = run.Slot;
            if (!_included[slot]) continue;
            int before = count;
            foreach (float v in values.Slice(run.Start, run.Length))
            {
                if (!ParameterValidity.IsValid(parameter, v)) continue;
                sums?.Add(slot, v);
                float value = v + 0f; // -0 becomes +0, whose bits sort first
                keys[count++] = (long)BitConverter.SingleToInt32Bits(value) << 32 | (uint)slot;
            }
            slotCounts[slot] += count - before;
        }
        return count;
    }

    /// <param name="slotCounts">The keys of each slot, counted while they were packed.</param>
    private SortedPeriodValues Deal(ReadOnlySpan<long> sortedKeys, int[] slotCounts)
    {
        // Per period: the count of its steps, from the steps per slot.
        var counts = new int[Periods.Count];
        var monthCounts = new long[Periods.Count * 12];
        for (int s = 0; s < slotCounts.Length; s++)
        {
            if (slotCounts[s] == 0) continue;
            counts[_monthOfSlot[s]] += slotCounts[s];
            counts[_seasonOfSlot[s]] += slotCounts[s];
            counts[_yearOfSlot[s]] += slotCounts[s];
            monthCounts[_monthOfSlot[s] * 12 + s % 12] += slotCounts[s];
            monthCounts[_seasonOfSlot[s] * 12 + s % 12] += slotCounts[s];
            monthCounts[_yearOfSlot[s] * 12 + s % 12] += slotCounts[s];
            if (_annual >= 0) monthCounts[_annual * 12 + s % 12] += slotCounts[s];
        }
        if (sortedKeys.IsEmpty) return new SortedPeriodValues(counts, monthCounts); // also when the window holds no slot (and no annual)
        counts[_annual] = sortedKeys.Length;
        var sorted = new SortedPeriodValues(counts, monthCounts);
        (double[] values, byte[] months, int[] starts) = sorted.Runs;
        int[] next = [.. starts];
        // The annual run is every value in order; the other three a stable scatter. A fixed four writes per value,
        // with no loop over a slot's periods, runs about twice as fast as the general form.
        // Seasons and the annual run also keep each value's calendar month, for the month-balanced statistics.
        Span<double> annual = values.AsSpan(starts[_annual], sortedKeys.Length);
        Span<byte> annualMonths = months.AsSpan(starts[_annual], sortedKeys.Length);
        // The hot loop reads the slot tables and writes the runs through references: every index was bounded above (a
        // slot is below the slot count, a run's cursor stays inside the run its count made).
        ref int monthOf = ref MemoryMarshal.GetArrayDataReference(_monthOfSlot);
        ref int seasonOf = ref MemoryMarshal.GetArrayDataReference(_seasonOfSlot);
        ref int yearOf = ref MemoryMarshal.GetArrayDataReference(_yearOfSlot);
        ref int cursor = ref MemoryMarshal.GetArrayDataReference(next);
        ref double run = ref MemoryMarshal.GetArrayDataReference(values);
        ref byte runMonth = ref MemoryMarshal.GetArrayDataReference(months);
        for (int i = 0; i < sortedKeys.Length; i++)
        {
            long key = sortedKeys[i];
            double value = BitConverter.Int32BitsToSingle((int)(key >> 32));
            int slot = (int)(key & 0xFFFF_FFFF);
            byte month = (byte)(slot % 12);
            annual[i] = value;
            annualMonths[i] = month;
            Unsafe.Add(ref run, Unsafe.Add(ref cursor, Unsafe.Add(ref monthOf, slot))++) = value;
            int season = Unsafe.Add(ref cursor, Unsafe.Add(ref seasonOf, slot))++;
            Unsafe.Add(ref run, season) = value;
            Unsafe.Add(ref runMonth, season) = month;
            Unsafe.Add(ref run, Unsafe.Add(ref cursor, Unsafe.Add(ref yearOf, slot))++) = value;
        }
        return sorted;
    }
}

/// <summary>A period of a point analysis window: its slots with steps, the steps it expects (calendar-true), and those per calendar month.</summary>
internal sealed record WindowPeriod(AtlasPeriod Period, int[] Slots, long Expected, long[] ExpectedByMonth);
