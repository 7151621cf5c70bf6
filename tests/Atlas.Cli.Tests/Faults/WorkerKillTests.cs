using System.Text.Json;
using Atlas.Ingest.Worker;
using Atlas.Storage.Jobs;
using Atlas.TestSupport;

namespace Atlas.Cli.Tests.Faults;

/// <summary>
/// A worker process killed with SIGKILL in the middle of a COPY (no shutdown code runs), and a new worker started:
/// the file ends up loaded once and fully (the second worker's metrics are scraped too). And one stopped with SIGTERM.
/// </summary>
public sealed class WorkerKillTests(TestDatabase database) : IClassFixture<TestDatabase>, IDisposable
{
    private const int Steps = 2920, Nx = 80, Ny = 60;
    private readonly string _folder = Directory.CreateTempSubdirectory("atlas-fault-kill-").FullName;

    private Dictionary<string, string> Environment => new() { ["ATLAS_DB"] = database.ConnectionString };

    /// <summary>Queues the ingest of a fresh fixture into <paramref name="slug"/>; returns the job id.</summary>
    private async Task<long> QueueIngestAsync(JobQueue queue, string slug) =>
        await queue.EnqueueAsync(JobKind.Ingest, slug, JsonSerializer.Serialize(
            new IngestPayload([HindcastFixture.Make(_folder, slug + ".nc", Steps, Nx, Ny)], QueueStatistics: false)));

    private Task WaitForCopyAsync(RunningAtlas worker) =>
        Patience.UntilAsync(async () => await StoredHindcast.CopyBackendAsync(database.DataSource, database.Name) is not null,
            $"the worker to start its COPY\n{worker.Output}");

    [Fact]
    public async Task AWorkerKilledMidCopyLeavesTheFileToTheNextWorkerWhichLoadsItOnceAndFully()
    {
        var queue = new JobQueue(database.DataSource);
        var id = await QueueIngestAsync(queue, "killed");
        using (var first = new RunningAtlas("worker", Environment))
        {
            await WaitForCopyAsync(first);
            first.Kill();
        }
        // Nothing of the dead worker's transaction is visible; its job still says running until someone notices.
        Assert.Null(await new Storage.Datasets.DatasetStore(database.DataSource).FindAsync("killed"));
        Assert.Equal(0L, await StoredHindcast.CountAsync(database.DataSource, "SELECT count(*) FROM series_chunk"));
        Assert.Equal("running", (await queue.FindAsync(id))!.State);

        var port = RunningAtlas.FreePort();
        using var second = new RunningAtlas($"worker --metrics-urls http://127.0.0.1:{port}", Environment);
        await Patience.UntilAsync(async () => (await queue.FindAsync(id))!.State is "done" or "failed",
            $"the second worker to finish the job\n{second.Output}");
        var job = (await queue.FindAsync(id))!;
        Assert.True(job.State == "done", job.Error);
        Assert.Equal(2, job.Attempts);
        await StoredHindcast.AssertHoldsExactlyAsync(database.DataSource, "killed", Steps, Nx, Ny);

        // The job counters of the worker that finished it, in the Prometheus text format.
        using var http = new HttpClient();
        var metrics = await http.GetStringAsync($"http://127.0.0.1:{port}/metrics");
        Assert.Matches("atlas_job_claimed_total\\{[^}]*atlas_job_kind=\"ingest\"[^}]*\\} 1", metrics);
        Assert.Matches("atlas_job_finished_total\\{[^}]*atlas_job_kind=\"ingest\"[^}]*atlas_job_outcome=\"done\"[^}]*\\} 1", metrics);
        Assert.Matches($"atlas_ingest_steps_total\\{{[^}}]*\\}} {Steps}", metrics);
        Assert.Matches($"atlas_ingest_cells_total\\{{[^}}]*\\}} {Nx * Ny - 1}", metrics);
        Assert.Contains("atlas_job_duration_seconds_bucket", metrics);

        Assert.Equal(0, second.Terminate());
    }

    [Fact]
    public async Task AWorkerStoppedWithSigtermMidCopyPutsItsJobBackUnwrittenAndExitsCleanly()
    {
        var queue = new JobQueue(database.DataSource);
        var id = await QueueIngestAsync(queue, "stopped");
        using (var worker = new RunningAtlas("worker", Environment))
        {
            await WaitForCopyAsync(worker);
            // As systemd and docker stop a service. The worker's own limit is 30 s (the unit allows 60 s); past it the
            // host stops waiting for the job and the exit code is not 0, so the wait here needs no limit of its own.
            Assert.Equal(0, worker.Terminate());
        }
        var job = (await queue.FindAsync(id))!;
        Assert.Equal("queued", job.State);
        Assert.Null(job.ClaimedBy);
        Assert.Null(await new Storage.Datasets.DatasetStore(database.DataSource).FindAsync("stopped"));
        // Leave no queued job for the other test of this database.
        await using var remove = database.DataSource.CreateCommand($"DELETE FROM job WHERE job_id = {id}");
        await remove.ExecuteNonQueryAsync();
    }

    public void Dispose() => Directory.Delete(_folder, recursive: true);
}
