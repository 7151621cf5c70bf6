using System.Diagnostics;
using System.Diagnostics.Metrics;
using Atlas.Ingest.Ingestion;
using Atlas.Ingest.Statistics;
using Atlas.Storage.Jobs;

namespace Atlas.Ingest.Worker;

/// <summary>
/// The counters and histograms of ingest and statistics jobs, on the meter <see cref="MeterName"/>. A process exports
/// them by adding that meter to its OpenTelemetry metrics (the worker's <c>--metrics-urls</c>, the API's
/// <c>/metrics</c>); with no listener attached, recording costs next to nothing.
/// </summary>
public static class JobMetrics
{
    public const string MeterName = "Atlas.Jobs";

    private static readonly Meter Meter = new(MeterName, typeof(JobMetrics).Assembly.GetName().Version?.ToString());

    private static readonly Counter<long> Claimed = Meter.CreateCounter<long>("atlas.job.claimed", "{job}", "Jobs taken from the queue by this process");
    private static readonly Counter<long> Finished = Meter.CreateCounter<long>("atlas.job.finished", "{job}",
        "Jobs this process ended, by outcome: done, failed, or released (put back in the queue at shutdown)");
    private static readonly Histogram<double> Duration = Meter.CreateHistogram<double>("atlas.job.duration", "s",
        "Wall-clock time from claiming a job to its end, by kind and outcome");
    private static readonly Counter<long> FilesIngested = Meter.CreateCounter<long>("atlas.ingest.files", "{file}", "Hindcast files loaded");
    private static readonly Counter<long> StepsIngested = Meter.CreateCounter<long>("atlas.ingest.steps", "{step}", "Time steps loaded");
    private static readonly Counter<long> CellsIngested = Meter.CreateCounter<long>("atlas.ingest.cells", "{cell}", "Cell series written by ingest jobs");
    private static readonly Counter<long> BytesIngested = Meter.CreateCounter<long>("atlas.ingest.read", "By", "Bytes read from hindcast files");
    private static readonly Counter<long> CellsComputed = Meter.CreateCounter<long>("atlas.statistics.cells", "{cell}", "Cells whose statistics were computed");
    private static readonly Counter<long> RowsComputed = Meter.CreateCounter<long>("atlas.statistics.rows", "{row}", "Statistics rows written");

    public static void RecordClaimed(JobKind kind) => Claimed.Add(1, KindTag(kind));

    public static void RecordFinished(JobKind kind, string outcome, TimeSpan elapsed)
    {
        var tags = new TagList { KindTag(kind), new("atlas.job.outcome", outcome) };
        Finished.Add(1, tags);
        Duration.Record(elapsed.TotalSeconds, tags);
    }

    public static void RecordIngest(IngestSummary summary)
    {
        FilesIngested.Add(summary.FilesLoaded);
        StepsIngested.Add(summary.StepsLoaded);
        CellsIngested.Add(summary.CellsWritten);
        BytesIngested.Add(summary.BytesRead);
    }

    public static void RecordStatistics(StatisticsSummary summary)
    {
        CellsComputed.Add(summary.Cells);
        RowsComputed.Add(summary.Rows);
    }

    private static KeyValuePair<string, object?> KindTag(JobKind kind) => new("atlas.job.kind", JobQueue.KindName(kind));
}
