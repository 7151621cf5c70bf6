namespace Atlas.Ingest.Statistics;

/// <summary>
/// A dataset's whole time line (Unix seconds, UTC), the years' stored time lines laid end to end, with each year's
/// first step and step count on it: where a cell's yearly chunks go in its series.
/// </summary>
public sealed class DatasetTimeline
{
    private DatasetTimeline(long[] times, IReadOnlyDictionary<int, (int Offset, int Count)> years)
    {
        Times = times;
        Years = years;
    }

    public long[] Times { get; }

    /// <summary>Per year: its first step on <see cref="Times"/> and its step count.</summary>
    public IReadOnlyDictionary<int, (int Offset, int Count)> Years { get; }

    public static DatasetTimeline Of(SortedDictionary<int, long[]> timelines)
    {
        var years = new Dictionary<int, (int, int)>();
        var offset = 0;
        foreach (var (year, line) in timelines)
        {
            years[year] = (offset, line.Length);
            offset += line.Length;
        }
        return new DatasetTimeline(timelines.Values.SelectMany(t => t).ToArray(), years);
    }
}
