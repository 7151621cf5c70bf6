using Atlas.Storage.Datasets;
using Atlas.Storage.Jobs;
using Atlas.TestSupport;

namespace Atlas.Cli.Tests.Faults;

/// <summary>
/// A worker process killed with SIGKILL in the middle of a part of a statistics pass (a batch of the part already
/// staged, the rest not), and a worker started again with <c>--until-idle</c>: the part is redone, the pass completes
/// and the worker stops once the queue is empty, and the stored statistics are, block for block, those of a plain
/// pass over the same file: nothing doubled, nothing missing.
/// </summary>
public sealed class PassWorkerKillTests(TestDatabase database) : IClassFixture<TestDatabase>, IDisposable
{
    private const int Steps = 2920, Nx = 80, Ny = 60;
    private readonly string _folder = Directory.CreateTempSubdirectory("atlas-fault-pass-kill-").FullName;

    private Dictionary<string, string> Environment => new() { ["ATLAS_DB"] = database.ConnectionString };

    private void Run(string arguments)
    {
        var (code, output) = AtlasProcess.Run(arguments, Environment);
        Assert.True(code == 0, $"atlas {arguments}:\n{output}");
    }

    [Fact]
    public async Task AWorkerKilledMidPartLeavesThePartToTheNextWorkerAndThePassStoresWhatAPlainPassStores()
    {
        var file = HindcastFixture.Make(_folder, "pass.nc", Steps, Nx, Ny);
        Run($"ingest \"{file}\" --dataset kill-plain");
        Run($"ingest \"{file}\" --dataset kill-parts --no-stats");
        // One part of every cell: a part of three batches (2,000 cells each), so a staged batch means a part half done.
        Run("stats kill-parts --queue --part-cells 8192");
        var queue = new JobQueue(database.DataSource);
        var part = Assert.Single(await queue.ForDatasetAsync("kill-parts"), j => j.Kind == JobKind.StatisticsPart);

        using (var first = new RunningAtlas("worker", Environment))
        {
            await Patience.UntilAsync(async () => await CountAsync("SELECT count(*) FROM statistic_block_stage") > 0,
                $"the worker to stage the part's first batch\n{first.Output}");
            first.Kill();
        }
        Assert.Equal("running", (await queue.FindAsync(part.Id))!.State);
        Assert.Equal(0L, await CountAsync("SELECT count(*) FROM statistic_block WHERE dataset_id = $1", await DatasetIdAsync("kill-parts")));

        using (var second = new RunningAtlas("worker --until-idle", Environment))
        {
            await Patience.UntilAsync(() => Task.FromResult(second.HasExited), $"the second worker to run the part and stop\n{second.Output}");
            Assert.True(second.Terminate() == 0, second.Output);
        }
        var done = (await queue.FindAsync(part.Id))!;
        Assert.True(done.State == "done", done.Error);
        Assert.Equal(2, done.Attempts);
        Assert.Contains("pass complete", done.Summary);

        var plain = await DatasetIdAsync("kill-plain");
        var parts = await DatasetIdAsync("kill-parts");
        var expected = await StoredStatistics.BlocksAsync(database.DataSource, "kill-plain");
        Assert.NotEmpty(expected);
        Assert.Equal(expected, await StoredStatistics.BlocksAsync(database.DataSource, "kill-parts"));
        Assert.Equal(await CountAsync("SELECT count(*) FROM cell_statistic_state WHERE dataset_id = $1", plain),
            await CountAsync("SELECT count(*) FROM cell_statistic_state WHERE dataset_id = $1", parts));
        Assert.Equal((long)(Nx * Ny - 1), await CountAsync("SELECT count(*) FROM cell_statistic_state WHERE dataset_id = $1", parts));
        Assert.Equal(0L, await CountAsync("SELECT count(*) FROM statistic_block_stage"));

        var (code, jobs) = AtlasProcess.Run("jobs --dataset kill-parts", Environment);
        Assert.True(code == 0, jobs);
        Assert.Contains("parts: 1 done, 0 running, 0 queued, 0 failed of 1", jobs);
    }

    [Fact]
    public async Task AWorkerKilledMidCopyOfAnIngestPartLeavesThePartToTheNextWorkerAndTheFileIsLoadedOnceAndFully()
    {
        var file = HindcastFixture.Make(_folder, "load.nc", Steps, Nx, Ny);
        // Two parts of 40 grid rows each.
        Run($"ingest \"{file}\" --dataset kill-load --queue --part-cells 3200");
        var queue = new JobQueue(database.DataSource);
        Assert.Equal(2, (await queue.ForDatasetAsync("kill-load")).Count(j => j.Kind == JobKind.IngestPart));

        using (var first = new RunningAtlas("worker", Environment))
        {
            await Patience.UntilAsync(async () => await StoredHindcast.CopyBackendAsync(database.DataSource, database.Name) is not null,
                $"the worker to start a part's COPY\n{first.Output}");
            first.Kill();
        }
        Assert.Null(await new DatasetStore(database.DataSource).FindAsync("kill-load"));

        using (var second = new RunningAtlas("worker --until-idle", Environment))
        {
            await Patience.UntilAsync(() => Task.FromResult(second.HasExited), $"the second worker to load the parts and stop\n{second.Output}");
            Assert.True(second.Terminate() == 0, second.Output);
        }
        var parts = (await queue.ForDatasetAsync("kill-load")).Where(j => j.Kind == JobKind.IngestPart).ToList();
        Assert.All(parts, p => Assert.True(p.State == "done", p.Error));
        Assert.Contains(parts, p => p.Attempts == 2);
        // Every step once, every wet cell, the file's values (the closed form make_fixture.py writes).
        await StoredHindcast.AssertHoldsExactlyAsync(database.DataSource, "kill-load", Steps, Nx, Ny);
    }

    private async Task<int> DatasetIdAsync(string slug) => (await new DatasetStore(database.DataSource).FindAsync(slug))!.Id;

    private Task<long> CountAsync(string sql, params object[] parameters) => StoredHindcast.CountAsync(database.DataSource, sql, parameters);

    public void Dispose() => Directory.Delete(_folder, recursive: true);
}
