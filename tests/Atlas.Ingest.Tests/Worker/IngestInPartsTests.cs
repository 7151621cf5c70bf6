using Atlas.Ingest.Ingestion;
using Atlas.Ingest.Worker;
using Atlas.Storage.Datasets;
using Atlas.Storage.Jobs;
using Atlas.Storage.Passes;
using Atlas.TestSupport;

namespace Atlas.Ingest.Tests.Worker;

/// <summary>
/// The first load of a dataset in parts (ranges of grid rows), run part by part as two workers run them: it stores
/// exactly what a plain load of the same file stores (which the ingest tests hold against the netCDF4-python fixture),
/// the dataset is not there at all until the last part is done, and a part that fails leaves nothing behind.
/// </summary>
public sealed class IngestInPartsTests(TestDatabase database) : IClassFixture<TestDatabase>
{
    private const int Nx = 60, Ny = 40, Steps = 120;

    private JobQueue Queue => new(database.DataSource);

    private static IngestPayload Payload(string file) => new([file], QueueStatistics: false);

    /// <summary>What a dataset stores, as text: every series chunk's bytes (digested), its cells, time lines and files.</summary>
    private async Task<List<string>> StoredAsync(string slug)
    {
        await using var command = database.DataSource.CreateCommand("""
            SELECT 'chunk ' || cell_id || ' ' || year || ' ' || step_count || ' ' || md5(payload) FROM series_chunk s JOIN dataset d USING (dataset_id) WHERE d.slug = $1
            UNION ALL
            SELECT concat_ws(' ', 'cell', cell_id, grid_i, grid_j, ST_AsText(geom), depth_m, wet, coast_distance_m) FROM cell JOIN dataset d USING (dataset_id) WHERE d.slug = $1
            UNION ALL
            SELECT 'year ' || year || ' ' || times::text FROM dataset_year JOIN dataset d USING (dataset_id) WHERE d.slug = $1
            UNION ALL
            SELECT concat_ws(' ', 'file', file_name, checksum, size_bytes, time_start, time_end, step_count) FROM source_file JOIN dataset d USING (dataset_id) WHERE d.slug = $1
            UNION ALL
            SELECT concat_ws(' ', 'dataset', title, grid_kind, nx, ny, point_count, ST_AsText(extent), grid::text, metadata::text) FROM dataset d WHERE d.slug = $1
            ORDER BY 1
            """);
        command.Parameters.AddWithValue(slug);
        var rows = new List<string>();
        await using var reader = await command.ExecuteReaderAsync();
        while (await reader.ReadAsync()) rows.Add(reader.GetString(0));
        return rows;
    }

    [Fact]
    public async Task ALoadInPartsByTwoWorkersStoresWhatAPlainLoadStoresAndTheDatasetAppearsOnlyWithTheLastPart()
    {
        var file = FixtureFiles.Make("parts-load.nc", 0, Steps, $"--nx {Nx} --ny {Ny}");
        await new HindcastIngestor(database.DataSource).RunAsync(new IngestRequest("load-plain", [file]));
        var queued = await new IngestInParts(database.DataSource).QueueAsync(Payload(file), "load-parts", partCells: 1000);
        Assert.NotNull(queued.Pass);
        Assert.Equal(3, queued.Pass!.PartCount);   // 16 rows of 60 points a part: rows 0-15, 16-31, 32-39

        Assert.Single(await QueuedParts.RunAsync(database.DataSource, "worker-a", 1));
        Assert.Single(await QueuedParts.RunAsync(database.DataSource, "worker-b", 1));
        Assert.Null(await new DatasetStore(database.DataSource).FindAsync("load-parts"));
        Assert.Empty(await StoredAsync("load-parts"));

        var last = Assert.Single(await QueuedParts.RunAsync(database.DataSource, "worker-a"));
        Assert.Contains("dataset load-parts created", last);
        var expected = (await StoredAsync("load-plain")).Select(r => r.Replace("load-plain", "load-parts")).ToList();
        Assert.Equal(Nx * Ny - 1, expected.Count(r => r.StartsWith("chunk ", StringComparison.Ordinal)));
        Assert.Equal(expected, await StoredAsync("load-parts"));
        Assert.Equal("done", (await new PassStore(database.DataSource).FindAsync(queued.Pass.Id))!.State);
    }

    [Fact]
    public async Task APartThatFailsFailsTheLoadAndLeavesNoSeriesBehind()
    {
        var file = FixtureFiles.Make("parts-fail.nc", 0, Steps, $"--nx {Nx} --ny {Ny}");
        var queued = await new IngestInParts(database.DataSource).QueueAsync(Payload(file), "load-failing", partCells: 1000);
        var pass = queued.Pass!;
        Assert.Single(await QueuedParts.RunAsync(database.DataSource, "worker", 1));
        Assert.True(await CountSeriesAsync(pass.DatasetId) > 0);

        // The second part's file went missing before a worker claimed it.
        await using (var spoil = database.DataSource.CreateCommand("UPDATE job SET payload = jsonb_set(payload, '{Files}', '[\"/nonexistent/gone.nc\"]') WHERE pass_id = $1 AND part = 1"))
        {
            spoil.Parameters.AddWithValue(pass.Id);
            Assert.Equal(1, await spoil.ExecuteNonQueryAsync());
        }
        var job = (await Queue.ClaimAsync("worker"))!;
        var error = await Assert.ThrowsAnyAsync<Exception>(() => new JobRunner(database.DataSource).RunAsync(job, null, CancellationToken.None));
        Assert.Contains("gone.nc", error.Message);

        Assert.Equal("failed", (await new PassStore(database.DataSource).FindAsync(pass.Id))!.State);
        Assert.Null(await Queue.ClaimAsync("worker"));
        Assert.Null(await new DatasetStore(database.DataSource).FindAsync("load-failing"));
        Assert.Equal(0L, await CountSeriesAsync(pass.DatasetId));
    }

    [Fact]
    public async Task ALoadIntoAnExistingDatasetIsQueuedWholeAndAnOpenLoadInPartsRefusesAPlainLoad()
    {
        var first = FixtureFiles.Make("parts-first.nc", 0, Steps, $"--nx {Nx} --ny {Ny}");
        var second = FixtureFiles.Make("parts-second.nc", Steps * 3, Steps, $"--nx {Nx} --ny {Ny}");
        var parts = new IngestInParts(database.DataSource);
        var queued = await parts.QueueAsync(Payload(first), "load-twice", partCells: 1000);
        await Assert.ThrowsAsync<PassOpenException>(() => parts.QueueAsync(Payload(first), "load-twice"));
        await Assert.ThrowsAsync<PassOpenException>(() => new HindcastIngestor(database.DataSource).RunAsync(new IngestRequest("load-twice", [first])));
        Assert.Equal(queued.Pass!.PartCount, (await QueuedParts.RunAsync(database.DataSource, "worker")).Count);

        var whole = await parts.QueueAsync(Payload(second), "load-twice");
        Assert.Null(whole.Pass);
        var job = (await Queue.FindAsync(whole.WholeJobId!.Value))!;
        Assert.Equal(JobKind.Ingest, job.Kind);
        Assert.Contains($"{Steps:N0} time steps", Assert.Single(await QueuedParts.RunAsync(database.DataSource, "worker")));
        Assert.Equal("nothing new", (await parts.QueueAsync(Payload(second), "load-twice")).Describe().Split(": ")[1][..11]);
    }

    private async Task<long> CountSeriesAsync(int datasetId)
    {
        await using var command = database.DataSource.CreateCommand("SELECT count(*) FROM series_chunk WHERE dataset_id = $1");
        command.Parameters.AddWithValue(datasetId);
        return (long)(await command.ExecuteScalarAsync())!;
    }
}
