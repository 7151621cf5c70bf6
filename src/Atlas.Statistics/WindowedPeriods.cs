using System.Buffers;

namespace Atlas.Statistics;

/// <summary>The periods present in a point analysis window, the slots of each, and the sorted values of a parameter per period.</summary>
internal sealed class WindowedPeriods
{
    private readonly bool[] _included;
    // The periods a slot belongs to (its month, season, the whole window and its year: at most four), in rows of four.
    private const int MaxPeriodsPerSlot = 4;
    private readonly int[] _periodsOfSlot;
    private readonly int[] _periodCountOfSlot;

    public WindowedPeriods(TimelineCalendar calendar, AnalysisWindow? window)
    {
        Calendar = calendar;
        _included = new bool[calendar.SlotCount];
        for (int s = 0; s < _included.Length; s++)
        {
            _included[s] = calendar.StepsInSlot(s) > 0 && (window?.Contains(calendar.YearOfSlot(s), TimelineCalendar.MonthOfSlot(s)) ?? true);
            if (_included[s]) StepsInWindow += calendar.StepsInSlot(s);
        }

        var periods = new List<(AtlasPeriod, int[], long)>();
        var periodsOfSlot = new List<int>[calendar.SlotCount];
        for (int s = 0; s < periodsOfSlot.Length; s++) periodsOfSlot[s] = [];
        foreach (AtlasPeriod period in calendar.PeriodsPresent)
        {
            int[] slots = [.. calendar.SlotsOf(period).ToArray().Where(s => _included[s])];
            if (slots.Length == 0) continue;
            long expected = slots.Sum(calendar.StepsInSlot);
            foreach (int s in slots) periodsOfSlot[s].Add(periods.Count);
            periods.Add((period, slots, expected));
        }
        Periods = periods;
        _periodsOfSlot = new int[MaxPeriodsPerSlot * calendar.SlotCount];
        _periodCountOfSlot = new int[calendar.SlotCount];
        for (int s = 0; s < periodsOfSlot.Length; s++)
        {
            if (periodsOfSlot[s].Count > MaxPeriodsPerSlot)
                throw new InvalidOperationException($"A calendar slot belongs to {periodsOfSlot[s].Count} periods; at most {MaxPeriodsPerSlot} were expected.");
            periodsOfSlot[s].CopyTo(_periodsOfSlot, MaxPeriodsPerSlot * s);
            _periodCountOfSlot[s] = periodsOfSlot[s].Count;
        }
    }

    public TimelineCalendar Calendar { get; }

    public long StepsInWindow { get; }

    public IReadOnlyList<(AtlasPeriod Period, int[] Slots, long Expected)> Periods { get; }

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
            int count = Pack(values, parameter, keys, sums);
            ValueRadixSort.SortByUpperHalf(keys.AsSpan(0, count), buffer);
            return Deal(keys.AsSpan(0, count));
        }
        finally
        {
            ArrayPool<long>.Shared.Return(keys);
            ArrayPool<long>.Shared.Return(buffer);
        }
    }

    private int Pack(ReadOnlySpan<float> values, WaveParameter parameter, Span<long> keys, SlotSums? sums)
    {
        ReadOnlySpan<int> stepSlots = Calendar.StepSlots;
        int count = 0;
        for (int i = 0; i < values.Length; i++)
        {
            int slot = stepSlots[i];
            if (!_included[slot] || !ParameterValidity.IsValid(parameter, values[i])) continue;
            sums?.Add(slot, values[i]);
            float value = values[i] + 0f; // -0 becomes +0, whose bits sort first
            keys[count++] = (long)BitConverter.SingleToInt32Bits(value) << 32 | (uint)slot;
        }
        return count;
    }

    private SortedPeriodValues Deal(ReadOnlySpan<long> sortedKeys)
    {
        // Per period: the count of its steps, from the steps per slot.
        var slotCounts = new int[_periodCountOfSlot.Length];
        foreach (long key in sortedKeys) slotCounts[(int)(key & 0xFFFF_FFFF)]++;
        var counts = new int[Periods.Count];
        for (int s = 0; s < slotCounts.Length; s++)
            for (int k = 0; k < _periodCountOfSlot[s]; k++) counts[_periodsOfSlot[MaxPeriodsPerSlot * s + k]] += slotCounts[s];
        var sorted = new SortedPeriodValues(counts);
        (double[] values, int[] starts) = sorted.Runs;
        int[] next = [.. starts];
        foreach (long key in sortedKeys)
        {
            double value = BitConverter.Int32BitsToSingle((int)(key >> 32));
            int slot = (int)(key & 0xFFFF_FFFF), row = MaxPeriodsPerSlot * slot;
            for (int k = 0; k < _periodCountOfSlot[slot]; k++) values[next[_periodsOfSlot[row + k]]++] = value;
        }
        return sorted;
    }
}
