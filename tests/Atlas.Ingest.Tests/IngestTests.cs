using Atlas.Hindcast;
using Atlas.Ingest.Ingestion;
using Atlas.Storage.Series;
using Atlas.TestSupport;

namespace Atlas.Ingest.Tests;

public class IngestTests(TestDatabase database) : IClassFixture<TestDatabase>
{
    private const int Nx = 6, Ny = 5;

    private HindcastIngestor Ingestor => new(database.DataSource);

    [Theory]
    [InlineData("NETCDF4", "")]
    [InlineData("NETCDF4", "--packed")]
    [InlineData("NETCDF3_CLASSIC", "")]
    [InlineData("NETCDF3_64BIT_OFFSET", "--packed")]
    public async Task StoredValuesEqualTheFileWithinTheQuantisation(string format, string packing)
    {
        var slug = $"roundtrip-{format.ToLowerInvariant().Replace('_', '-')}{(packing.Length > 0 ? "-packed" : "")}";
        var file = FixtureFiles.Make($"{slug}.nc", 0, 40, $"--format {format} {packing}");
        var summary = await Ingestor.RunAsync(new IngestRequest(slug, [file]));
        Assert.Equal(1, summary.FilesLoaded);
        Assert.Equal(Nx * Ny - 1, summary.WetCells);

        var dataset = (await new Storage.Datasets.DatasetStore(database.DataSource).FindAsync(slug))!;
        var cells = await new Storage.Cells.CellStore(database.DataSource).AllAsync(dataset.Id);
        Assert.False(cells.Single(c => c.CellId == 0).Wet);
        var series = new SeriesStore(database.DataSource);
        // Packed fixtures were themselves rounded to 0.001 m / 0.01 s / 0.01 degree by netCDF4-python.
        var tolerance = packing.Length > 0 ? (hs: 0.0011, period: 0.011, dir: 0.011) : (hs: 0.0006, period: 0.0051, dir: 0.0051);
        foreach (var (j, i) in new[] { (1, 0), (4, 5), (2, 3), (0, 1) })
        {
            var cell = cells.Single(c => c.CellId == j * Nx + i);
            Assert.Equal(-20.0 + 0.1 * i, cell.Longitude, 5);
            Assert.Equal(50.0 + 0.1 * j, cell.Latitude, 5);
            Assert.Equal(5.0 + 10.0 * i, cell.DepthMetres!.Value, 3);
            var chunk = (await series.ReadCellAsync(dataset.Id, cell.CellId)).Single();
            var n = SeriesCodec.StepCountOf(chunk.Payload);
            Assert.Equal(40, n);
            float[] hs = new float[n], te = new float[n], tp = new float[n], dir = new float[n], spread = new float[n];
            SeriesCodec.Decode(chunk.Payload, WaveParameter.Hs, hs);
            SeriesCodec.Decode(chunk.Payload, WaveParameter.Te, te);
            SeriesCodec.Decode(chunk.Payload, WaveParameter.Tp, tp);
            SeriesCodec.Decode(chunk.Payload, WaveParameter.Dir, dir);
            SeriesCodec.Decode(chunk.Payload, WaveParameter.Spread, spread);
            for (var s = 0; s < n; s++)
            {
                var e = FixtureFiles.Expected(3.0 * s, j, i);
                Assert.InRange(hs[s], e.Hs - tolerance.hs, e.Hs + tolerance.hs);
                Assert.InRange(te[s], e.Te - tolerance.period, e.Te + tolerance.period);
                Assert.InRange(tp[s], e.Tp - tolerance.period, e.Tp + tolerance.period);
                Assert.InRange(spread[s], e.Spread - tolerance.dir, e.Spread + tolerance.dir);
                var d = Math.Abs(dir[s] - e.Dir);
                Assert.True(Math.Min(d, 360 - d) <= tolerance.dir, $"direction {dir[s]} vs {e.Dir}");
            }
        }
    }

    // The cells are loaded in blocks that fit the memory budget (the load's first two a quarter and a half of the
    // others), and each block's steps in tiles of 32: a budget of 13 cells' series (blocks of 3, 6, 12 and 9 cells;
    // 40 steps, a tile of 32 and one of 8) stores every cell's series byte for byte as one block of all 30 cells does.
    [Fact]
    public async Task BlocksOfAnySizeStoreTheSameBytes()
    {
        var file = FixtureFiles.Make("blocks-of-any-size.nc", 0, 40);
        var bytesPerCell = SeriesCodec.EncodedLength(40, 5);
        await Ingestor.RunAsync(new IngestRequest("blocks-whole", [file]));
        await Ingestor.RunAsync(new IngestRequest("blocks-small", [file], MemoryBudgetBytes: 2L * 13 * bytesPerCell));
        var whole = await PayloadsAsync("blocks-whole");
        var small = await PayloadsAsync("blocks-small");
        Assert.Equal(Nx * Ny - 1, whole.Count);
        Assert.Equal(whole.Keys, small.Keys);
        foreach (var (cell, payload) in whole) Assert.Equal(payload, small[cell]);
    }

    private async Task<SortedDictionary<int, byte[]>> PayloadsAsync(string slug)
    {
        var payloads = new SortedDictionary<int, byte[]>();
        await using var command = database.DataSource.CreateCommand(
            "SELECT c.cell_id, c.payload FROM series_chunk c JOIN dataset d USING (dataset_id) WHERE d.slug = $1");
        command.Parameters.AddWithValue(slug);
        await using var reader = await command.ExecuteReaderAsync();
        while (await reader.ReadAsync()) payloads.Add(reader.GetInt32(0), (byte[])reader[1]);
        return payloads;
    }

    [Fact]
    public async Task IngestingTheSameFileAgainChangesNothing()
    {
        var file = FixtureFiles.Make("again.nc", 0, 16);
        await Ingestor.RunAsync(new IngestRequest("again", [file]));
        var before = await CountsAsync("again");
        var second = await Ingestor.RunAsync(new IngestRequest("again", [file]));
        Assert.Equal(0, second.FilesLoaded);
        Assert.Equal(1, second.FilesSkipped);
        Assert.Contains("nothing new", second.Describe());
        Assert.Equal(before, await CountsAsync("again"));
    }

    // One request naming the same bytes twice (a copy under another name) loads them once; a file of the same size with
    // other bytes (the next hours, written alike) is loaded. The BLAKE3 team's b3sum gives the checksums the stored ones
    // must be.
    [Fact]
    public async Task ACopyUnderAnotherNameIsLoadedOnceAndAFileOfTheSameSizeIsNot()
    {
        var first = FixtureFiles.Make("copies-a.nc", 0, 8);
        var copy = Path.Combine(Path.GetDirectoryName(first)!, "copies-a-copy.nc");
        File.Copy(first, copy, overwrite: true);
        var next = FixtureFiles.Make("copies-b.nc", 8, 8);
        Assert.Equal(new FileInfo(first).Length, new FileInfo(next).Length);
        var summary = await Ingestor.RunAsync(new IngestRequest("copies", [first, copy, next]));
        Assert.Equal(2, summary.FilesLoaded);
        Assert.Equal(1, summary.FilesSkipped);
        Assert.Equal(["blake3:" + Printed("b3sum", first), "blake3:" + Printed("b3sum", next)], await StoredChecksumsAsync("copies"));
    }

    // A dataset loaded when checksums were SHA-256 (the migration prefixes them "sha256:"): the same file given again is
    // known by its SHA-256 (GNU sha256sum's digits) and not loaded twice; a new file beside it loads with BLAKE3.
    [Fact]
    public async Task AFileRecordedBySha256IsKnownWhenGivenAgain()
    {
        var first = FixtureFiles.Make("older-a.nc", 0, 8);
        var next = FixtureFiles.Make("older-b.nc", 8, 8);
        await Ingestor.RunAsync(new IngestRequest("older", [first]));
        await using (var older = database.DataSource.CreateCommand(
            "UPDATE source_file SET checksum = $1 WHERE dataset_id = (SELECT dataset_id FROM dataset WHERE slug = 'older')"))
        {
            older.Parameters.AddWithValue("sha256:" + Printed("sha256sum", first));
            Assert.Equal(1, await older.ExecuteNonQueryAsync());
        }
        var again = await Ingestor.RunAsync(new IngestRequest("older", [first, next]));
        Assert.Equal(1, again.FilesLoaded);
        Assert.Equal(1, again.FilesSkipped);
        Assert.Equal(["sha256:" + Printed("sha256sum", first), "blake3:" + Printed("b3sum", next)], await StoredChecksumsAsync("older"));
    }

    private async Task<List<string>> StoredChecksumsAsync(string slug)
    {
        await using var command = database.DataSource.CreateCommand(
            "SELECT checksum FROM source_file s JOIN dataset d USING (dataset_id) WHERE d.slug = $1 ORDER BY file_name");
        command.Parameters.AddWithValue(slug);
        var stored = new List<string>();
        await using var reader = await command.ExecuteReaderAsync();
        while (await reader.ReadAsync()) stored.Add(reader.GetString(0));
        return stored;
    }

    private static string Printed(string program, string path) => Atlas.Ingest.Tests.Ingestion.FileChecksumTests.Printed(program, path);

    [Fact]
    public async Task MonthlyFilesOfOneYearJoinIntoOneChunkPerCell()
    {
        var january = FixtureFiles.Make("join-jan.nc", 0, 8);
        var february = FixtureFiles.Make("join-feb.nc", 31 * 24, 8);
        await Ingestor.RunAsync(new IngestRequest("join", [january]));
        await Ingestor.RunAsync(new IngestRequest("join", [february]));
        var dataset = (await new Storage.Datasets.DatasetStore(database.DataSource).FindAsync("join"))!;
        var timeline = (await new Storage.Datasets.DatasetStore(database.DataSource).TimelinesAsync(dataset.Id))[2020];
        Assert.Equal(16, timeline.Length);
        var chunk = (await new SeriesStore(database.DataSource).ReadCellAsync(dataset.Id, 1 * Nx + 2)).Single();
        var hs = new float[16];
        SeriesCodec.Decode(chunk.Payload, WaveParameter.Hs, hs);
        Assert.Equal(FixtureFiles.Expected(0, 1, 2).Hs, hs[0], 3);
        Assert.Equal(FixtureFiles.Expected(31 * 24 + 3, 1, 2).Hs, hs[9], 3);
    }

    [Fact]
    public async Task AFileOverlappingStoredStepsWithOtherValuesIsRefusedUnlessReplacing()
    {
        var first = FixtureFiles.Make("overlap-a.nc", 0, 10);
        // Hs 0.5 m higher than the stored steps 15..27 h (identical values would be stored once, see ConventionIngestTests).
        var overlapping = FixtureFiles.Make("overlap-b.nc", 15, 10, "--lon0 -20 --hs-offset 0.5");
        await Ingestor.RunAsync(new IngestRequest("overlap", [first]));
        var before = await CountsAsync("overlap");
        var error = await Assert.ThrowsAsync<IngestException>(() => Ingestor.RunAsync(new IngestRequest("overlap", [overlapping])));
        Assert.Contains("overlap-b.nc", error.Message);
        Assert.Contains("--replace", error.Message);
        Assert.Equal(before, await CountsAsync("overlap"));
        var replaced = await Ingestor.RunAsync(new IngestRequest("overlap", [overlapping], ReplaceOverlap: true));
        Assert.Equal(1, replaced.FilesLoaded);
        var dataset = (await new Storage.Datasets.DatasetStore(database.DataSource).FindAsync("overlap"))!;
        var timeline = (await new Storage.Datasets.DatasetStore(database.DataSource).TimelinesAsync(dataset.Id))[2020];
        Assert.Equal(15, timeline.Length); // steps 0..27 h and 15..42 h at 3 h: 0,3,...,42
    }

    [Fact]
    public async Task AMissingHsVariableIsNamedAndNothingIsStored()
    {
        var file = FixtureFiles.Make("no-hs.nc", 0, 4, "--no-hs");
        var error = await Assert.ThrowsAnyAsync<Exception>(() => Ingestor.RunAsync(new IngestRequest("no-hs", [file])));
        Assert.Contains("no-hs.nc", error.Message);
        Assert.Contains("sea_surface_wave_significant_height", error.Message);
        Assert.Null(await new Storage.Datasets.DatasetStore(database.DataSource).FindAsync("no-hs"));
    }

    [Fact]
    public async Task AFileOnAnotherGridIsRefusedAndTheStoredDatasetIsUntouched()
    {
        await Ingestor.RunAsync(new IngestRequest("grids", [FixtureFiles.Make("grid-a.nc", 0, 4)]));
        var before = await CountsAsync("grids");
        var shifted = FixtureFiles.Make("grid-b.nc", 100, 4, "--lon0 -19");
        var error = await Assert.ThrowsAsync<IngestException>(() => Ingestor.RunAsync(new IngestRequest("grids", [shifted])));
        Assert.Contains("grid-b.nc", error.Message);
        Assert.Contains("grid", error.Message);
        Assert.Equal(before, await CountsAsync("grids"));
    }

    [Fact]
    public async Task ATruncatedFileIsRefusedByName()
    {
        var good = FixtureFiles.Make("truncated.nc", 0, 50);
        var bytes = await File.ReadAllBytesAsync(good);
        await File.WriteAllBytesAsync(good, bytes[..(bytes.Length / 3)]);
        var error = await Assert.ThrowsAnyAsync<Exception>(() => Ingestor.RunAsync(new IngestRequest("truncated", [good])));
        Assert.Contains("truncated.nc", error.Message);
        Assert.Null(await new Storage.Datasets.DatasetStore(database.DataSource).FindAsync("truncated"));
    }

    [Fact]
    public async Task ANegativeWaveHeightFailsTheWholeFileAndStoresNothing()
    {
        var file = FixtureFiles.Make("negative.nc", 0, 4, "--negative-hs");
        var error = await Assert.ThrowsAsync<IngestException>(() => Ingestor.RunAsync(new IngestRequest("negative", [file])));
        Assert.Contains("negative.nc", error.Message);
        Assert.Contains("Hs", error.Message);
        // The first value refused in step order: the second step (make_fixture.py makes its heights negative).
        Assert.Contains("at 2020-01-01T03:00:00Z", error.Message);
        Assert.Null(await new Storage.Datasets.DatasetStore(database.DataSource).FindAsync("negative"));
    }

    [Fact]
    public async Task ACancelledIngestLeavesNothingVisibleAndCanBeRunAgain()
    {
        var file = FixtureFiles.Make("cancelled.nc", 0, 200);
        using var cancel = new CancellationTokenSource();
        var progress = new CancelOnStage("loading", cancel);
        await Assert.ThrowsAnyAsync<OperationCanceledException>(() =>
            Ingestor.RunAsync(new IngestRequest("cancelled", [file], MemoryBudgetBytes: 4096), progress, cancel.Token));
        Assert.Null(await new Storage.Datasets.DatasetStore(database.DataSource).FindAsync("cancelled"));
        var summary = await Ingestor.RunAsync(new IngestRequest("cancelled", [file]));
        Assert.Equal(1, summary.FilesLoaded);
        Assert.Equal(200, summary.StepsLoaded);
    }

    private sealed class CancelOnStage(string stage, CancellationTokenSource cancel) : IProgress<Progress.ProgressSnapshot>
    {
        public void Report(Progress.ProgressSnapshot value)
        {
            if (value.Stage.StartsWith(stage) && value.Done > 0) cancel.Cancel();
        }
    }

    private Task<(long Chunks, long Cells, long Files, string Payloads)> CountsAsync(string slug) => IngestCounts.OfAsync(database, slug);
}
