namespace Atlas.Ingest.Progress;

/// <summary>How far a long job has got: work units done of total, bytes moved, and a few words on the stage.</summary>
public sealed record ProgressSnapshot(string Stage, long Done, long Total, long Bytes, TimeSpan Elapsed, string Unit)
{
    public double Fraction => Total <= 0 ? 0 : Math.Clamp((double)Done / Total, 0, 1);

    public double? RatePerSecond => Elapsed.TotalSeconds > 0.2 ? Done / Elapsed.TotalSeconds : null;

    public double? MegabytesPerSecond => Elapsed.TotalSeconds > 0.2 && Bytes > 0 ? Bytes / 1e6 / Elapsed.TotalSeconds : null;

    public TimeSpan? Remaining => Fraction is > 0.01 and < 1 ? TimeSpan.FromSeconds(Elapsed.TotalSeconds * (1 - Fraction) / Fraction) : null;

    /// <summary>One line: stage, percent, rate, MB/s and time left.</summary>
    public string Describe()
    {
        var parts = new List<string> { $"{Stage}: {Fraction * 100,5:F1}% ({Done:N0}/{Total:N0} {Unit})" };
        if (RatePerSecond is { } rate) parts.Add($"{rate:N0} {Unit}/s");
        if (MegabytesPerSecond is { } mbs) parts.Add($"{mbs:F0} MB/s");
        if (Remaining is { } left) parts.Add($"{FormatDuration(left)} left");
        return string.Join(", ", parts);
    }

    public static string FormatDuration(TimeSpan span) =>
        span.TotalHours >= 1 ? $"{(int)span.TotalHours}h{span.Minutes:D2}m" :
        span.TotalMinutes >= 1 ? $"{(int)span.TotalMinutes}m{span.Seconds:D2}s" : $"{span.TotalSeconds:F1}s";
}
