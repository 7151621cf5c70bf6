using Atlas.Ingest.Worker;
using Atlas.Storage.Jobs;
using Npgsql;

namespace Atlas.Ingest.Tests.Worker;

/// <summary>Runs queued jobs in this process as a worker of the given name does: claim, run, one after another.</summary>
public static class QueuedParts
{
    /// <summary>Claims and runs queued jobs as <paramref name="worker"/> until <paramref name="count"/> have run or none is left; their summaries.</summary>
    public static async Task<List<string>> RunAsync(NpgsqlDataSource dataSource, string worker, int count = int.MaxValue)
    {
        var queue = new JobQueue(dataSource);
        var runner = new JobRunner(dataSource);
        var summaries = new List<string>();
        while (summaries.Count < count && await queue.ClaimAsync(worker) is { } job)
            summaries.Add(await runner.RunAsync(job, null, CancellationToken.None));
        return summaries;
    }
}
