using System.Text.Json;
using Atlas.Ingest.Progress;
using Atlas.Ingest.Worker;
using Atlas.Storage.Jobs;
using Atlas.TestSupport;
using Npgsql;

namespace Atlas.Ingest.Tests.Worker;

/// <summary>A job that loses its connection mid-COPY, and a job cancelled by a shutdown, as the worker runs them.</summary>
public sealed class JobRunnerFaultTests(TestDatabase database) : IClassFixture<TestDatabase>
{
    private const int Steps = 1460, Nx = 60, Ny = 50;

    private JobQueue Queue => new(database.DataSource);

    private async Task<JobRecord> ClaimNewIngestAsync(string slug, string file)
    {
        var id = await Queue.EnqueueAsync(JobKind.Ingest, slug, JsonSerializer.Serialize(new IngestPayload([file], QueueStatistics: false)));
        return (await Queue.ClaimAsync(id, "fault-test"))!;
    }

    [Fact]
    public async Task ACopyWhoseBackendIsTerminatedFailsTheJobWithNothingVisibleAndARetrySucceeds()
    {
        var file = FixtureFiles.Make("terminated.nc", 0, Steps, $"--nx {Nx} --ny {Ny}");
        var job = await ClaimNewIngestAsync("terminated", file);
        var running = Task.Run(() => new JobRunner(database.DataSource).RunAsync(job, null, CancellationToken.None));
        int? pid = null;
        await Patience.UntilAsync(async () => (pid = await CopyBackendAsync()) is not null || running.IsCompleted, "the ingest to reach its COPY");
        Assert.True(pid is not null, "the ingest never reached its COPY");
        await using (var terminate = database.DataSource.CreateCommand("SELECT pg_terminate_backend($1)"))
        {
            terminate.Parameters.AddWithValue(pid!.Value);
            await terminate.ExecuteScalarAsync();
        }
        await Assert.ThrowsAnyAsync<Exception>(() => running);

        var failed = (await Queue.FindAsync(job.Id))!;
        Assert.Equal("failed", failed.State);
        Assert.False(string.IsNullOrWhiteSpace(failed.Error));
        Assert.Null(await new Storage.Datasets.DatasetStore(database.DataSource).FindAsync("terminated"));
        Assert.Equal(0L, await CountAsync("SELECT count(*) FROM series_chunk s JOIN dataset d USING (dataset_id) WHERE d.slug = 'terminated'"));

        var retry = await ClaimNewIngestAsync("terminated", file);
        var summary = await new JobRunner(database.DataSource).RunAsync(retry, null, CancellationToken.None);
        Assert.Contains($"{Steps:N0} time steps", summary);
        Assert.Equal("done", (await Queue.FindAsync(retry.Id))!.State);
        await AssertLoadedOnceAsync("terminated");
    }

    [Fact]
    public async Task AJobCancelledByShutdownIsPutBackInTheQueueWithNothingWrittenAndRunsAgainInFull()
    {
        var file = FixtureFiles.Make("shutdown.nc", 0, Steps, $"--nx {Nx} --ny {Ny}");
        var job = await ClaimNewIngestAsync("shutdown", file);
        using var stopping = new CancellationTokenSource();
        // Cancel as soon as the first block of series has been read: the transaction is open and has written rows.
        var display = new CancelOnStage("loading", stopping);
        await Assert.ThrowsAnyAsync<OperationCanceledException>(() => new JobRunner(database.DataSource).RunAsync(job, display, stopping.Token));

        var released = (await Queue.FindAsync(job.Id))!;
        Assert.Equal("queued", released.State);
        Assert.Null(released.ClaimedBy);
        Assert.Null(await new Storage.Datasets.DatasetStore(database.DataSource).FindAsync("shutdown"));

        var again = await Queue.ClaimAsync(job.Id, "after-restart");
        Assert.NotNull(again);
        Assert.Equal(2, again!.Attempts);
        await new JobRunner(database.DataSource).RunAsync(again, null, CancellationToken.None);
        Assert.Equal("done", (await Queue.FindAsync(job.Id))!.State);
        await AssertLoadedOnceAsync("shutdown");
    }

    private async Task AssertLoadedOnceAsync(string slug)
    {
        var dataset = (await new Storage.Datasets.DatasetStore(database.DataSource).FindAsync(slug))!;
        var times = (await new Storage.Datasets.DatasetStore(database.DataSource).TimelinesAsync(dataset.Id)).SelectMany(y => y.Value).ToArray();
        var epoch = new DateTimeOffset(FixtureFiles.Epoch).ToUnixTimeSeconds();
        Assert.Equal(Enumerable.Range(0, Steps).Select(s => epoch + s * 3 * 3600L), times);
        Assert.Equal(Nx * Ny - 1L, await CountAsync($"SELECT count(*) FROM series_chunk WHERE dataset_id = {dataset.Id}"));
        Assert.Equal(1L, await CountAsync($"SELECT count(*) FROM source_file WHERE dataset_id = {dataset.Id}"));
    }

    private async Task<int?> CopyBackendAsync()
    {
        await using var command = database.DataSource.CreateCommand(
            "SELECT pid FROM pg_stat_activity WHERE datname = $1 AND state = 'active' AND query ILIKE 'COPY %' LIMIT 1");
        command.Parameters.AddWithValue(database.Name);
        return await command.ExecuteScalarAsync() is int pid ? pid : null;
    }

    private async Task<long> CountAsync(string sql)
    {
        await using var command = database.DataSource.CreateCommand(sql);
        return Convert.ToInt64(await command.ExecuteScalarAsync());
    }

    private sealed class CancelOnStage(string stage, CancellationTokenSource cancel) : IProgress<ProgressSnapshot>
    {
        public void Report(ProgressSnapshot value)
        {
            if (value.Stage.StartsWith(stage, StringComparison.Ordinal) && value.Done > 0) cancel.Cancel();
        }
    }
}
