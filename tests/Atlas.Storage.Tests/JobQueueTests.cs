using Atlas.Storage.Jobs;
using Atlas.TestSupport;

namespace Atlas.Storage.Tests;

public class JobQueueTests(TestDatabase database) : IClassFixture<TestDatabase>
{
    [Fact]
    public async Task ConcurrentWorkersNeverClaimTheSameJob()
    {
        var queue = new JobQueue(database.DataSource);
        var ids = new List<long>();
        for (var i = 0; i < 20; i++) ids.Add(await queue.EnqueueAsync(JobKind.Statistics, "claims"));
        var claimed = new System.Collections.Concurrent.ConcurrentBag<long>();
        await Task.WhenAll(Enumerable.Range(0, 4).Select(w => Task.Run(async () =>
        {
            while (await queue.ClaimAsync($"worker-{w}") is { } job)
            {
                claimed.Add(job.Id);
                await queue.CompleteAsync(job.Id, "ok");
            }
        })));
        Assert.Equal(ids.Order(), claimed.Order());
    }

    [Fact]
    public async Task AJobWhoseWorkerStoppedBeatingGoesBackToTheQueue()
    {
        var queue = new JobQueue(database.DataSource);
        var id = await queue.EnqueueAsync(JobKind.Ingest, "stale");
        Assert.NotNull(await queue.ClaimAsync(id, "gone"));
        // The database's clock decides: wait until the heartbeat is over a second old by it, then requeue.
        await Patience.UntilAsync(() => ClaimIsOlderThanAsync(id, TimeSpan.FromSeconds(1)), "the heartbeat to be a second old");
        Assert.True(await queue.RequeueStaleAsync(TimeSpan.FromSeconds(1)) >= 1);
        var again = await queue.ClaimAsync(id, "second");
        Assert.NotNull(again);
        Assert.Equal(2, again!.Attempts);
    }

    [Fact]
    public async Task ARunningJobIsRequeuedAsSoonAsItsLeaseIsGoneButNotWhileItIsHeld()
    {
        var queue = new JobQueue(database.DataSource);
        var id = await queue.EnqueueAsync(JobKind.Ingest, "leased");
        Assert.NotNull(await queue.ClaimAsync(id, "holder"));
        var lease = await JobLease.TakeAsync(database.DataSource, id);
        await Patience.UntilAsync(() => ClaimIsOlderThanAsync(id, JobQueue.LeaseGrace), "the claim to be older than the lease grace");
        // The heartbeat limit is an hour away: only the lease decides here.
        await queue.RequeueStaleAsync(TimeSpan.FromHours(1));
        Assert.Equal("running", (await queue.FindAsync(id))!.State);
        await lease.DisposeAsync();
        await queue.RequeueStaleAsync(TimeSpan.FromHours(1));
        Assert.Equal("queued", (await queue.FindAsync(id))!.State);
        // Leave no queued job behind for the other tests of this database.
        await queue.CompleteAsync(id, "checked");
    }

    /// <summary>True when the job's claim and heartbeat are older than <paramref name="age"/> by the database's clock.</summary>
    private async Task<bool> ClaimIsOlderThanAsync(long id, TimeSpan age)
    {
        await using var command = database.DataSource.CreateCommand(
            "SELECT claimed_at < now() - $2 AND heartbeat_at < now() - $2 FROM job WHERE job_id = $1");
        command.Parameters.AddWithValue(id);
        command.Parameters.AddWithValue(age);
        return (bool)(await command.ExecuteScalarAsync())!;
    }
}
