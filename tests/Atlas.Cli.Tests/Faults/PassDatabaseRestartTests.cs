using Atlas.Storage;
using Atlas.Storage.Jobs;
using Atlas.Storage.Passes;
using Atlas.TestSupport;

namespace Atlas.Cli.Tests.Faults;

/// <summary>
/// PostgreSQL stopped and started again while a worker runs a statistics pass in parts: the part in hand fails on the
/// outage and goes back to the queue, the worker carries on once the server is back, and the pass completes with the
/// blocks a plain pass stores. The database is a throwaway embedded cluster on a port of its own.
/// </summary>
public sealed class PassDatabaseRestartTests : IAsyncLifetime
{
    private const int Steps = 2920, Nx = 80, Ny = 60;
    private readonly string _home = Directory.CreateTempSubdirectory("atlas-fault-pass-restart-").FullName;
    private EmbeddedCluster _cluster = null!;

    public async Task InitializeAsync()
    {
        _cluster = new EmbeddedCluster(_home, RunningAtlas.FreePort());
        await _cluster.EnsureRunningAsync();
    }

    public Task DisposeAsync()
    {
        try { _cluster.Stop(); }
        finally { Directory.Delete(_home, recursive: true); }
        return Task.CompletedTask;
    }

    [Fact]
    public async Task APassInPartsCompletesIdenticallyAfterThePrimaryRestartsUnderIt()
    {
        var environment = new Dictionary<string, string>
        {
            ["ATLAS_DB"] = _cluster.ConnectionString.Replace("Timeout=15", "Timeout=3"),
            ["ATLAS_HOME"] = _home,
        };
        void Run(string arguments)
        {
            var (code, output) = AtlasProcess.Run(arguments, environment);
            Assert.True(code == 0, $"atlas {arguments}:\n{output}");
        }
        var file = HindcastFixture.Make(_home, "restart.nc", Steps, Nx, Ny);
        Run($"ingest \"{file}\" --dataset restart-plain");
        Run($"ingest \"{file}\" --dataset restart-parts --no-stats");
        // Two parts: cell ids 0-4095 (three batches of up to 2,000 cells) and the rest.
        Run("stats restart-parts --queue --part-cells 4096");
        await using var dataSource = AtlasDatabase.CreateDataSource(_cluster.ConnectionString);
        var pass = Assert.Single(await new PassStore(dataSource).ProgressAsync("restart-parts")).Pass;

        using var worker = new RunningAtlas("worker", environment);
        // The first part under way, its first batch staged and two thirds of it still to compute: the server stops and
        // starts under the worker.
        await Patience.UntilAsync(async () =>
        {
            var progress = Assert.Single(await new PassStore(dataSource).ProgressAsync("restart-parts"));
            await using var staged = dataSource.CreateCommand("SELECT count(*) FROM statistic_block_stage");
            return progress is { Done: 0, Running: 1 } && (long)(await staged.ExecuteScalarAsync())! > 0;
        }, $"the first part to stage its first batch\n{worker.Output}");
        _cluster.Stop();
        await _cluster.EnsureRunningAsync();
        // The test's own pooled connections died with the server too.
        dataSource.Clear();

        var done = await Patience.UntilAsync(() => new PassStore(dataSource).FindAsync(pass.Id), p => p!.State != "open",
            $"the pass to end after the restart\n{worker.Output}");
        Assert.True(done!.State == "done", $"{done.Error}\n{worker.Output}");
        var parts = (await new JobQueue(dataSource).ForDatasetAsync("restart-parts")).Where(j => j.PassId == pass.Id).ToList();
        Assert.All(parts, p => Assert.Equal("done", p.State));
        Assert.True(parts.Sum(p => p.Attempts) > parts.Count, "no part was retried: the restart came between parts");
        Assert.False(worker.HasExited, worker.Output);

        Assert.Equal(await BlocksAsync(dataSource, "restart-plain"), await BlocksAsync(dataSource, "restart-parts"));
    }

    /// <summary>Every stored statistic block of a dataset, all columns as text, in key order.</summary>
    private static async Task<List<string>> BlocksAsync(Npgsql.NpgsqlDataSource dataSource, string slug)
    {
        await using var command = dataSource.CreateCommand("""
            SELECT concat_ws('|', parameter, period, block, cell_ids, count, coverage, mean, sd, min, max, p10, p50, p90, p99, extra_width, extra)
              FROM statistic_block b JOIN dataset d USING (dataset_id) WHERE d.slug = $1 ORDER BY parameter, period, block
            """);
        command.Parameters.AddWithValue(slug);
        var rows = new List<string>();
        await using var reader = await command.ExecuteReaderAsync();
        while (await reader.ReadAsync()) rows.Add(reader.GetString(0));
        Assert.NotEmpty(rows);
        return rows;
    }
}
