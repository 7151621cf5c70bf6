namespace Atlas.Api.Points;

/// <summary>
/// The calendars of the last few point timelines. The cells of a dataset share their time lines, so point requests
/// for the same years share a timeline, and building its calendar again (a pass over decades of hourly steps, and
/// megabytes of arrays) would cost each request a millisecond or more. A handful are kept, whatever the datasets and
/// windows asked, so that the memory they hold stays bounded: enough for the year ranges a script asks of a cell and of
/// the output point beside it at once.
/// </summary>
public sealed class PointCalendars
{
    private const int Kept = 8;
    private readonly TimelineCalendar?[] _recent = new TimelineCalendar?[Kept];
    private int _next;
    private readonly Lock _gate = new();

    /// <summary>A kept calendar of exactly these times, or a new one (then kept in place of the oldest).</summary>
    public TimelineCalendar For(ReadOnlySpan<long> times)
    {
        TimelineCalendar?[] recent;
        lock (_gate) recent = [.. _recent];
        foreach (var calendar in recent)
            if (calendar is not null && calendar.StepCount == times.Length && calendar.HasTimes(times)) return calendar;
        var built = new TimelineCalendar(times);
        lock (_gate)
        {
            _recent[_next] = built;
            _next = (_next + 1) % Kept;
        }
        return built;
    }
}
