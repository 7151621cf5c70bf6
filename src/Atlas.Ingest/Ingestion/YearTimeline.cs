namespace Atlas.Ingest.Ingestion;

/// <summary>Splits and merges time lines (Unix seconds, UTC) by calendar year.</summary>
public static class YearTimeline
{
    public static int YearOf(long unixSeconds) => DateTimeOffset.FromUnixTimeSeconds(unixSeconds).UtcDateTime.Year;

    /// <summary>The sorted union of two strictly increasing time lines.</summary>
    public static long[] Merge(long[] stored, IEnumerable<long> added)
    {
        var set = new SortedSet<long>(stored);
        foreach (var t in added) set.Add(t);
        return set.ToArray();
    }

    /// <summary>Describes a Unix time as ISO 8601 UTC.</summary>
    public static string Iso(long unixSeconds) => DateTimeOffset.FromUnixTimeSeconds(unixSeconds).UtcDateTime.ToString("yyyy-MM-dd'T'HH:mm:ss'Z'");
}
