using Atlas.Storage.Jobs;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Logging;
using Npgsql;

namespace Atlas.Ingest.Worker;

/// <summary>
/// The worker loop: claims the oldest queued job (FOR UPDATE SKIP LOCKED, so many workers share one queue), runs
/// it, and carries on; a failed job is logged and marked failed. Jobs of workers that died are re-queued after their
/// heartbeat goes stale. On shutdown the job in hand is cancelled, rolled back and put back in the queue. Run until
/// idle (<see cref="WorkerRunOptions.UntilIdle"/>), it stops the host once no job is queued or running: it waits while
/// another worker runs one, since a job of a worker that dies comes back to the queue.
/// </summary>
public sealed partial class QueueWorker(NpgsqlDataSource dataSource, JobRunner runner, ILogger<QueueWorker> logger,
    IHostApplicationLifetime lifetime, WorkerRunOptions? run = null) : BackgroundService
{
    public static readonly TimeSpan StaleAfter = TimeSpan.FromMinutes(2);

    /// <summary>How often a worker run until idle looks again while other workers' jobs are running.</summary>
    public static readonly TimeSpan IdleCheckInterval = TimeSpan.FromMilliseconds(250);
    private readonly string _name = $"{Environment.MachineName}:{Environment.ProcessId}";

    protected override async Task ExecuteAsync(CancellationToken stoppingToken)
    {
        var queue = new JobQueue(dataSource);
        LogStarted(_name);
        while (!stoppingToken.IsCancellationRequested)
        {
            JobRecord? job = null;
            try
            {
                await queue.RequeueStaleAsync(StaleAfter, stoppingToken);
                job = await queue.ClaimAsync(_name, stoppingToken);
                if (job is null)
                {
                    if (run?.UntilIdle == true && !await queue.AnyPendingAsync(stoppingToken))
                    {
                        LogIdle(_name);
                        lifetime.StopApplication();
                        break;
                    }
                    // Run until idle, the worker waits for the last jobs of others (and the requeue of a dead one's) at a
                    // shorter interval, so that its exit follows theirs closely.
                    await Task.Delay(run?.UntilIdle == true ? IdleCheckInterval : TimeSpan.FromSeconds(2), stoppingToken);
                    continue;
                }
                LogClaimed(job.Id, JobQueue.KindName(job.Kind), job.DatasetSlug);
                var summary = await runner.RunAsync(job, null, stoppingToken);
                LogDone(job.Id, summary);
            }
            catch (OperationCanceledException) when (stoppingToken.IsCancellationRequested)
            {
                break;
            }
            catch (Exception e)
            {
                if (job is not null) LogFailed(job.Id, e.Message);
                else LogQueueError(e.Message);
                try { await Task.Delay(TimeSpan.FromSeconds(2), stoppingToken); }
                catch (OperationCanceledException) { break; }
            }
        }
    }

    [LoggerMessage(Level = LogLevel.Information, Message = "worker {Name} started")]
    private partial void LogStarted(string name);

    [LoggerMessage(Level = LogLevel.Information, Message = "worker {Name}: no job queued or running, stopping")]
    private partial void LogIdle(string name);

    [LoggerMessage(Level = LogLevel.Information, Message = "job {JobId} claimed: {Kind} {Dataset}")]
    private partial void LogClaimed(long jobId, string kind, string dataset);

    [LoggerMessage(Level = LogLevel.Information, Message = "job {JobId} done: {Summary}")]
    private partial void LogDone(long jobId, string summary);

    [LoggerMessage(Level = LogLevel.Error, Message = "job {JobId} failed: {Error}")]
    private partial void LogFailed(long jobId, string error);

    [LoggerMessage(Level = LogLevel.Warning, Message = "job queue unavailable: {Error}")]
    private partial void LogQueueError(string error);
}

/// <summary>How a worker runs: <paramref name="UntilIdle"/> stops it once no job is queued or running.</summary>
public sealed record WorkerRunOptions(bool UntilIdle);
