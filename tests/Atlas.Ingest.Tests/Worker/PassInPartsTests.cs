using Atlas.Ingest.Ingestion;
using Atlas.Ingest.Statistics;
using Atlas.Ingest.Worker;
using Atlas.Storage.Datasets;
using Atlas.Storage.Jobs;
using Atlas.Storage.Passes;
using Atlas.Storage.Queries;
using Atlas.TestSupport;

namespace Atlas.Ingest.Tests.Worker;

/// <summary>
/// A statistics pass in parts, run part by part as workers run them: it stores exactly what the plain pass stores
/// (which StatisticsAgreeWithCdoTests holds against CDO), readers and the statistics stamp see nothing of it until the
/// last part is done, a part redone after its worker died stores nothing twice, and two passes of one dataset never
/// interleave.
/// </summary>
public sealed class PassInPartsTests(TestDatabase database) : IClassFixture<TestDatabase>
{
    // 2,400 grid points: blocks 0, 1 and 2 (cell ids 0..1023, 1024..2047, 2048..2399); point 0 is land in the fixture.
    private const int Nx = 60, Ny = 40, Steps = 240;

    private JobQueue Queue => new(database.DataSource);

    private async Task<int> LoadAsync(string slug)
    {
        var file = FixtureFiles.Make(slug + ".nc", 0, Steps, $"--nx {Nx} --ny {Ny}");
        await new HindcastIngestor(database.DataSource).RunAsync(new IngestRequest(slug, [file]));
        return (await new DatasetStore(database.DataSource).FindAsync(slug))!.Id;
    }

    private Task<List<string>> BlocksAsync(string slug) => StoredStatistics.BlocksAsync(database.DataSource, slug);

    private Task<StatisticsStamp> StampAsync(int datasetId) => new DatasetGeometryQueries(database.DataSource).StatisticsStampAsync(datasetId);

    [Fact]
    public async Task APassInPartsRunByTwoWorkersStoresWhatThePlainPassStoresAndPublishesItOnlyWithTheLastPart()
    {
        var plainId = await LoadAsync("parts-plain");
        await new StatisticsService(database.DataSource).RunAsync("parts-plain", all: false);
        var expected = await BlocksAsync("parts-plain");
        Assert.NotEmpty(expected);

        var partedId = await LoadAsync("parts-queued");
        var queued = await new StatisticsPasses(database.DataSource).QueueAsync("parts-queued", all: false, partCells: 1024);
        Assert.NotNull(queued);
        Assert.Equal(3, queued!.Pass.PartCount);
        Assert.Equal(Nx * Ny - 1, queued.Cells);

        // Two of the three parts done, by two workers: nothing is served yet, and the stamp has not moved.
        Assert.Single(await QueuedParts.RunAsync(database.DataSource, "worker-a", 1));
        Assert.Single(await QueuedParts.RunAsync(database.DataSource, "worker-b", 1));
        Assert.Empty(await BlocksAsync("parts-queued"));
        Assert.Equal("none", (await StampAsync(partedId)).Token);
        var progress = Assert.Single(await new PassStore(database.DataSource).ProgressAsync("parts-queued"));
        Assert.Equal((2, 0, 1, 0), (progress.Done, progress.Running, progress.Queued, progress.Failed));

        var last = Assert.Single(await QueuedParts.RunAsync(database.DataSource, "worker-a"));
        Assert.Contains("pass complete", last);
        Assert.Equal(expected, await BlocksAsync("parts-queued"));
        var stamp = await StampAsync(partedId);
        Assert.Equal(Nx * Ny - 1, stamp.CellCount);
        Assert.Equal(queued.Pass.ComputedAtUtc, stamp.ComputedAtUtc);
        Assert.Equal(0L, await CountAsync("SELECT count(*) FROM statistic_block_stage"));
        Assert.Equal("done", (await new PassStore(database.DataSource).FindAsync(queued.Pass.Id))!.State);
        // The method notes were recorded as a plain pass records them; nothing is left to compute.
        var metadata = (await new DatasetStore(database.DataSource).FindAsync("parts-queued"))!.MetadataJson;
        Assert.Equal(Atlas.Statistics.MethodNotes.Version, StatisticsService.StoredMethodVersion(metadata));
        Assert.Null(await new StatisticsPasses(database.DataSource).QueueAsync("parts-queued", all: false));
    }

    [Fact]
    public async Task APartRedoneAfterItsWorkerDiedMidWayStoresNothingTwice()
    {
        var plainId = await LoadAsync("redo-plain");
        await new StatisticsService(database.DataSource).RunAsync("redo-plain", all: false);
        var partedId = await LoadAsync("redo-queued");
        var queued = (await new StatisticsPasses(database.DataSource).QueueAsync("redo-queued", all: false, partCells: 1024))!;

        // A worker claimed part 1 and staged a batch of its blocks, then died before marking it done (its lease went
        // with its session). Here the batch is the plain pass's block 0, with every mean doubled: what it left must
        // not survive the redo.
        var dead = (await Queue.ClaimAsync("dead-worker"))!;
        await using (var stage = database.DataSource.CreateCommand("""
            INSERT INTO statistic_block_stage SELECT $1, dataset_id, parameter, period, block, cell_ids, count, coverage,
                   (SELECT array_agg(v * 2) FROM unnest(mean) v), sd, min, max, p10, p50, p90, p99, extra_width, extra
              FROM statistic_block WHERE dataset_id = $2 AND block = 0
            """))
        {
            stage.Parameters.AddWithValue(queued.Pass.Id);
            stage.Parameters.AddWithValue(plainId);
            Assert.True(await stage.ExecuteNonQueryAsync() > 0);
        }
        await using (var retarget = database.DataSource.CreateCommand("UPDATE statistic_block_stage SET dataset_id = $1 WHERE pass_id = $2"))
        {
            retarget.Parameters.AddWithValue(partedId);
            retarget.Parameters.AddWithValue(queued.Pass.Id);
            await retarget.ExecuteNonQueryAsync();
        }
        Assert.Equal(1, await RequeueAsync(dead.Id));

        var summaries = await QueuedParts.RunAsync(database.DataSource, "live-worker");
        Assert.Equal(3, summaries.Count);
        Assert.Equal(await BlocksAsync("redo-plain"), await BlocksAsync("redo-queued"));
        Assert.Equal(2, (await Queue.FindAsync(dead.Id))!.Attempts);
    }

    [Fact]
    public async Task ASecondPassOfADatasetIsRefusedWhileOneIsOpenAndAPlainPassToo()
    {
        await LoadAsync("twice");
        var passes = new StatisticsPasses(database.DataSource);
        var first = (await passes.QueueAsync("twice", all: true, partCells: 1024))!;
        var refused = await Assert.ThrowsAsync<PassOpenException>(() => passes.QueueAsync("twice", all: true));
        Assert.Equal(first.Pass.Id, refused.OpenPassId);
        Assert.Contains($"pass {first.Pass.Id}", refused.Message);
        await Assert.ThrowsAsync<PassOpenException>(() => new StatisticsService(database.DataSource).RunAsync("twice", all: true));
        Assert.Equal(3, (await QueuedParts.RunAsync(database.DataSource, "worker")).Count);
        Assert.NotNull(await passes.QueueAsync("twice", all: true, partCells: 1024));
        Assert.Equal(3, (await QueuedParts.RunAsync(database.DataSource, "worker")).Count);
    }

    [Fact]
    public async Task APartThatFailsFailsItsPassAndTheStatisticsStayThoseOfTheLastCompletePass()
    {
        var id = await LoadAsync("failing");
        await new StatisticsService(database.DataSource).RunAsync("failing", all: false);
        var before = await BlocksAsync("failing");
        var stampBefore = await StampAsync(id);
        var queued = (await new StatisticsPasses(database.DataSource).QueueAsync("failing", all: true, partCells: 1024))!;
        Assert.Single(await QueuedParts.RunAsync(database.DataSource, "worker", 1));

        // The second part's payload names no blocks array: it fails as a malformed job would, for good.
        await using (var spoil = database.DataSource.CreateCommand("UPDATE job SET payload = '{\"Blocks\": \"spoilt\"}' WHERE pass_id = $1 AND part = 1"))
        {
            spoil.Parameters.AddWithValue(queued.Pass.Id);
            Assert.Equal(1, await spoil.ExecuteNonQueryAsync());
        }
        var job = (await Queue.ClaimAsync("worker"))!;
        await Assert.ThrowsAnyAsync<Exception>(() => new JobRunner(database.DataSource).RunAsync(job, null, CancellationToken.None));

        var pass = (await new PassStore(database.DataSource).FindAsync(queued.Pass.Id))!;
        Assert.Equal("failed", pass.State);
        Assert.Contains("part 2", pass.Error);
        Assert.Null(await Queue.ClaimAsync("worker"));
        Assert.Equal(before, await BlocksAsync("failing"));
        Assert.Equal(stampBefore, await StampAsync(id));
        Assert.Equal(0L, await CountAsync("SELECT count(*) FROM statistic_block_stage WHERE pass_id = " + queued.Pass.Id));
    }

    [Fact]
    public async Task APartTakenFromItsWorkerIsNotMarkedDoneByIt()
    {
        await LoadAsync("lost");
        var queued = (await new StatisticsPasses(database.DataSource).QueueAsync("lost", all: true, partCells: 4096))!;
        var slow = (await Queue.ClaimAsync("slow-worker"))!;
        // Its heartbeat lapsed: the part went back to the queue and another worker claimed it.
        Assert.Equal(1, await RequeueAsync(slow.Id));
        var other = (await Queue.ClaimAsync("other-worker"))!;
        Assert.Equal(slow.Id, other.Id);

        await Assert.ThrowsAsync<PartLostException>(() => new JobRunner(database.DataSource).RunAsync(slow, null, CancellationToken.None));
        var job = (await Queue.FindAsync(slow.Id))!;
        Assert.Equal(("running", "other-worker"), (job.State, job.ClaimedBy));
        Assert.Equal("open", (await new PassStore(database.DataSource).FindAsync(queued.Pass.Id))!.State);

        Assert.Contains("pass complete", await new JobRunner(database.DataSource).RunAsync(other, null, CancellationToken.None));
    }

    /// <summary>Queues a running job again as <see cref="JobQueue.RequeueStaleAsync"/> does once its heartbeat is stale.</summary>
    private async Task<int> RequeueAsync(long jobId)
    {
        await using var command = database.DataSource.CreateCommand("UPDATE job SET state = 'queued', claimed_by = NULL WHERE job_id = $1 AND state = 'running'");
        command.Parameters.AddWithValue(jobId);
        return await command.ExecuteNonQueryAsync();
    }

    private async Task<long> CountAsync(string sql)
    {
        await using var command = database.DataSource.CreateCommand(sql);
        return Convert.ToInt64(await command.ExecuteScalarAsync());
    }
}
