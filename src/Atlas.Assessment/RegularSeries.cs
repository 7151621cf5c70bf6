using Atlas.Statistics;

namespace Atlas.Assessment;

/// <summary>
/// A time series on a fixed step. Missing steps (gaps, fill values, dry cells) are stored as NaN,
/// so every index still stands for one step of <see cref="StepSeconds"/> starting at
/// <see cref="TimeAt"/>.
/// </summary>
public sealed class RegularSeries
{
    private readonly double[] _values;

    /// <summary>Creates a series from its first time, its step and its values (copied).</summary>
    /// <param name="startUnixSeconds">Time of the first value, Unix seconds (UTC).</param>
    /// <param name="stepSeconds">Step between values, seconds; must be positive.</param>
    /// <param name="values">One value per step; NaN marks a missing step.</param>
    /// <exception cref="ArgumentOutOfRangeException">The step is not positive.</exception>
    public RegularSeries(long startUnixSeconds, long stepSeconds, ReadOnlySpan<double> values)
    {
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(stepSeconds);
        StartUnixSeconds = startUnixSeconds;
        StepSeconds = stepSeconds;
        _values = values.ToArray();
    }

    /// <summary>
    /// Builds a regular series from explicit times. The step is the smallest difference between
    /// consecutive times; every difference must be a whole multiple of it, and the steps a larger
    /// difference skips become NaN (a record that simply omits missing times is accepted).
    /// </summary>
    /// <exception cref="ArgumentException">Lengths differ, there are fewer than two times, or the
    /// times are not strictly increasing on a common step.</exception>
    public static RegularSeries FromTimes(ReadOnlySpan<long> timesUnixSeconds, ReadOnlySpan<double> values)
    {
        if (timesUnixSeconds.Length != values.Length)
            throw new ArgumentException($"{timesUnixSeconds.Length} times but {values.Length} values.", nameof(values));
        if (timesUnixSeconds.Length < 2)
            throw new ArgumentException("At least two times are needed to find the step.", nameof(timesUnixSeconds));

        long step = long.MaxValue;
        for (int i = 1; i < timesUnixSeconds.Length; i++)
        {
            long difference = timesUnixSeconds[i] - timesUnixSeconds[i - 1];
            if (difference <= 0)
                throw new ArgumentException(
                    $"Times must be strictly increasing; time {i} ({timesUnixSeconds[i]}) is not after time {i - 1} ({timesUnixSeconds[i - 1]}).",
                    nameof(timesUnixSeconds));
            step = Math.Min(step, difference);
        }

        long span = timesUnixSeconds[^1] - timesUnixSeconds[0];
        var filled = new double[checked((int)(span / step) + 1)];
        Array.Fill(filled, double.NaN);
        for (int i = 0; i < timesUnixSeconds.Length; i++)
        {
            long offset = timesUnixSeconds[i] - timesUnixSeconds[0];
            if (offset % step != 0)
                throw new ArgumentException(
                    $"Time {i} ({timesUnixSeconds[i]}) is not a whole number of {step} s steps after the first time.",
                    nameof(timesUnixSeconds));
            filled[offset / step] = values[i];
        }
        return new RegularSeries(timesUnixSeconds[0], step, filled);
    }

    /// <summary>Time of the first value, Unix seconds (UTC).</summary>
    public long StartUnixSeconds { get; }

    /// <summary>Step between values, seconds.</summary>
    public long StepSeconds { get; }

    /// <summary>Step between values, hours.</summary>
    public double StepHours => StepSeconds / 3600.0;

    /// <summary>Number of steps, missing ones included.</summary>
    public int Count => _values.Length;

    /// <summary>The values, NaN where a step is missing.</summary>
    public ReadOnlySpan<double> Values => _values;

    /// <summary>Time of step <paramref name="index"/>, Unix seconds (UTC).</summary>
    public long TimeAt(int index) => StartUnixSeconds + index * StepSeconds;

    /// <summary>True when <paramref name="other"/> has the same start, step and length.</summary>
    public bool IsAlignedWith(RegularSeries other) =>
        other.StartUnixSeconds == StartUnixSeconds && other.StepSeconds == StepSeconds && other.Count == Count;

    /// <summary>
    /// Consecutive index ranges [Start, End) that fall in one calendar month (UTC), in time order.
    /// </summary>
    internal IEnumerable<(int Year, int Month, int Start, int End)> MonthBlocks()
    {
        // The one calendar of the atlas (Statistics' TimelineCalendar) says which (year, month) slot each step is in.
        var times = new long[Count];
        for (int i = 0; i < times.Length; i++) times[i] = TimeAt(i);
        var calendar = new TimelineCalendar(times);
        int[] slots = calendar.StepSlots.ToArray();
        int start = 0;
        while (start < slots.Length)
        {
            int end = start + 1;
            while (end < slots.Length && slots[end] == slots[start]) end++;
            yield return (calendar.YearOfSlot(slots[start]), TimelineCalendar.MonthOfSlot(slots[start]), start, end);
            start = end;
        }
    }

    internal void RequireAlignedWith(RegularSeries other, string otherName)
    {
        if (!IsAlignedWith(other))
            throw new ArgumentException(
                $"Series '{otherName}' (start {other.StartUnixSeconds}, step {other.StepSeconds} s, {other.Count} steps) is not on the same times " +
                $"as the reference series (start {StartUnixSeconds}, step {StepSeconds} s, {Count} steps).",
                otherName);
    }
}
