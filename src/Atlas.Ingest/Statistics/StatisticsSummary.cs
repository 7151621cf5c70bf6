namespace Atlas.Ingest.Statistics;

/// <summary>The one-line outcome of a statistics pass.</summary>
/// <param name="MethodChanged">True when every cell was recomputed because the stored statistics came from another
/// version of the method (<see cref="Atlas.Statistics.MethodNotes.Version"/>).</param>
/// <param name="OptionsChanged">True when every cell was recomputed because the stored statistics were computed with
/// other statistics options (thresholds, coverage threshold, assumed spectrum or histogram bins), or with options
/// unknown because such a pass did not finish.</param>
public sealed record StatisticsSummary(string DatasetSlug, int Cells, int Periods, long Rows, long Steps, TimeSpan Elapsed, bool MethodChanged = false,
    bool OptionsChanged = false)
{
    public string Describe() => Cells == 0
        ? $"statistics {DatasetSlug}: up to date (no cell's series changed)"
        : $"statistics {DatasetSlug}: {Cells:N0} cells x {Periods} periods ({Rows:N0} rows) from {Steps:N0} cell-steps in " +
          $"{Progress.ProgressSnapshot.FormatDuration(Elapsed)} ({Steps / Math.Max(Elapsed.TotalSeconds, 1e-3) / 1e6:F1} M steps/s)" +
          (MethodChanged ? "; every cell recomputed: the stored statistics came from an earlier version of the method" : "") +
          (OptionsChanged ? "; every cell recomputed: the stored statistics were computed with other statistics options (section Statistics)" : "");
}
