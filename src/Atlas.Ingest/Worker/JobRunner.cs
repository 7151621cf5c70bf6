using System.Text.Json;
using Atlas.Hindcast;
using Atlas.Ingest.Ingestion;
using Atlas.Ingest.Progress;
using Atlas.Ingest.Statistics;
using Atlas.Statistics;
using Atlas.Storage;
using Atlas.Storage.Jobs;
using Atlas.Storage.Passes;
using Npgsql;

namespace Atlas.Ingest.Worker;

/// <summary>
/// Runs one claimed job to its end: reports progress as heartbeats, marks it done with its summary or failed with
/// the error's message. An ingest job queues a statistics job for its dataset when it loaded anything. A part of a
/// pass is marked done in the transaction that stores it (<see cref="StatisticsPasses"/>); one that fails on a
/// database outage (the server restarting, a connection lost) goes back to the queue to be retried, up to
/// <see cref="PartAttempts"/> attempts, and one that fails otherwise fails its pass, which then stores nothing.
/// </summary>
/// <param name="statistics">The statistics options of both jobs (the hosts bind them from configuration, section
/// <c>Statistics</c>); the published defaults when none are given.</param>
public sealed class JobRunner(NpgsqlDataSource dataSource, StatisticsOptions? statistics = null)
{
    private readonly JobQueue _queue = new(dataSource);
    private readonly HindcastIngestor _ingestor = new(dataSource, statistics);
    private readonly StatisticsService _statistics = new(dataSource, statistics);
    private readonly StatisticsPasses _passes = new(dataSource, statistics);
    private readonly IngestInParts _ingestParts = new(dataSource, statistics);
    private readonly PassStore _passStore = new(dataSource);

    /// <summary>How many times a part is tried in all before a database outage fails it (and its pass).</summary>
    public const int PartAttempts = 5;

    public async Task<string> RunAsync(JobRecord job, IProgress<ProgressSnapshot>? display, CancellationToken cancel)
    {
        var heartbeat = new HeartbeatProgress(_queue, job.Id, display);
        var clock = System.Diagnostics.Stopwatch.StartNew();
        JobMetrics.RecordClaimed(job.Kind);
        await using var lease = await JobLease.TakeAsync(dataSource, job.Id, cancel);
        try
        {
            string summary;
            if (job.Kind is JobKind.StatisticsPart or JobKind.IngestPart)
            {
                summary = job.Kind == JobKind.IngestPart
                    ? await _ingestParts.RunPartAsync(job, heartbeat, cancel)
                    : await _passes.RunPartAsync(job, heartbeat, cancel);
                // A part stored is done already; one that found its pass ended is done here, with nothing kept.
                await _queue.CompleteIfHeldAsync(job.Id, job.ClaimedBy ?? "", summary, CancellationToken.None);
                JobMetrics.RecordFinished(job.Kind, "done", clock.Elapsed);
                return summary;
            }
            if (job.Kind == JobKind.Ingest)
            {
                var payload = JsonSerializer.Deserialize<IngestPayload>(job.PayloadJson) ?? throw new IngestException($"Job {job.Id} has no ingest payload.");
                var mapping = payload.MappingFile is { } m ? VariableMapping.Load(m) : null;
                var result = await _ingestor.RunAsync(
                    new IngestRequest(job.DatasetSlug, payload.Files, payload.Title, payload.Replace, mapping, job.Id) { GridDataset = payload.GridDataset }, heartbeat, cancel);
                summary = result.Describe();
                JobMetrics.RecordIngest(result);
                if (result.FilesLoaded > 0 && payload.QueueStatistics)
                    await _queue.EnqueueAsync(JobKind.Statistics, job.DatasetSlug, "{}", CancellationToken.None);
            }
            else
            {
                var payload = JsonSerializer.Deserialize<StatisticsPayload>(job.PayloadJson) ?? new StatisticsPayload();
                var result = await _statistics.RunAsync(job.DatasetSlug, payload.All, heartbeat, cancel);
                summary = result.Describe();
                JobMetrics.RecordStatistics(result);
            }
            await _queue.CompleteAsync(job.Id, summary, CancellationToken.None);
            JobMetrics.RecordFinished(job.Kind, "done", clock.Elapsed);
            return summary;
        }
        catch (PartLostException)
        {
            // Another worker holds the part now: its state is theirs to set.
            JobMetrics.RecordFinished(job.Kind, "lost", clock.Elapsed);
            throw;
        }
        catch (Exception e) when (job.PassId is not null && e is not OperationCanceledException && DatabaseOutage.Is(e) && job.Attempts < PartAttempts)
        {
            // The lease's session may be gone with the server; if this release cannot reach it either, the lease check
            // of the next worker to look queues the part again.
            try { await _queue.ReleaseAsync(job.Id, CancellationToken.None); }
            catch (Exception again) when (DatabaseOutage.Is(again)) { }
            JobMetrics.RecordFinished(job.Kind, "retried", clock.Elapsed);
            throw;
        }
        catch (OperationCanceledException) when (cancel.IsCancellationRequested)
        {
            // Shutting down: the transaction was rolled back, so the job can be run again from the start.
            await _queue.ReleaseAsync(job.Id, CancellationToken.None);
            JobMetrics.RecordFinished(job.Kind, "released", clock.Elapsed);
            throw;
        }
        catch (Exception e) when (e is not OperationCanceledException)
        {
            if (job.PassId is not { } passId) await _queue.FailAsync(job.Id, e.Message, CancellationToken.None);
            // A part fails its pass only while this worker holds it: once requeued, it is another worker's to run.
            else if (await _queue.FailIfHeldAsync(job.Id, job.ClaimedBy ?? "", e.Message, CancellationToken.None))
                await _passStore.FailAsync(passId, $"part {job.Part + 1} (job {job.Id}) failed: {e.Message}", CancellationToken.None);
            JobMetrics.RecordFinished(job.Kind, "failed", clock.Elapsed);
            throw;
        }
    }

    private sealed class HeartbeatProgress(JobQueue queue, long jobId, IProgress<ProgressSnapshot>? display) : IProgress<ProgressSnapshot>
    {
        private DateTime _last = DateTime.MinValue;

        public void Report(ProgressSnapshot value)
        {
            display?.Report(value);
            if (DateTime.UtcNow - _last < TimeSpan.FromSeconds(5)) return;
            _last = DateTime.UtcNow;
            var json = JsonSerializer.Serialize(new { stage = value.Stage, done = value.Done, total = value.Total, fraction = value.Fraction, text = value.Describe() });
            // Fire and forget on the pool: a heartbeat must never slow the job down or fail it.
            _ = Task.Run(async () =>
            {
                try { await queue.HeartbeatAsync(jobId, json); }
                catch (NpgsqlException) { }
            });
        }
    }
}

/// <summary>The payload of an ingest job.</summary>
public sealed record IngestPayload(string[] Files, string? Title = null, bool Replace = false, string? MappingFile = null, bool QueueStatistics = true,
    string? GridDataset = null);

/// <summary>The payload of a statistics job.</summary>
public sealed record StatisticsPayload(bool All = false);
