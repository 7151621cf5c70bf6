using Atlas.Ingest.Ingestion;
using Atlas.Ingest.Statistics;
using Atlas.Storage.Datasets;
using Atlas.Storage.Statistics;
using Atlas.TestSupport;

namespace Atlas.Ingest.Tests;

/// <summary>
/// The statistics pass recomputes only the blocks of cells (1,024 cell ids each) whose series changed, and leaves the
/// others as they were.
/// </summary>
public class StatisticsRecomputeTests(TestDatabase database) : IClassFixture<TestDatabase>
{
    private const int Nx = 40, Ny = 30;   // 1,200 cells: block 0 holds ids 0..1023 (id 0 is dry), block 1 ids 1024..1199

    [Fact]
    public async Task OnlyTheBlockOfAChangedCellIsRecomputed()
    {
        var file = FixtureFiles.Make("blocks.nc", 0, 24, $"--nx {Nx} --ny {Ny}");
        await new HindcastIngestor(database.DataSource).RunAsync(new IngestRequest("blocks", [file]));
        var service = new StatisticsService(database.DataSource);
        var first = await service.RunAsync("blocks", all: false);
        Assert.Equal(Nx * Ny - 1, first.Cells);
        var dataset = (await new DatasetStore(database.DataSource).FindAsync("blocks"))!;
        var before = await LayerAsync(dataset.Id);
        var stampsBefore = await ComputedAtAsync(dataset.Id);

        await using (var touch = database.DataSource.CreateCommand(
            "UPDATE series_chunk SET written_at = now() WHERE dataset_id = $1 AND cell_id = 1100"))
        {
            touch.Parameters.AddWithValue(dataset.Id);
            Assert.Equal(1, await touch.ExecuteNonQueryAsync());
        }
        var second = await service.RunAsync("blocks", all: false);
        Assert.Equal(Nx * Ny - 1024, second.Cells);

        Assert.Equal(before, await LayerAsync(dataset.Id));
        var stampsAfter = await ComputedAtAsync(dataset.Id);
        Assert.All(stampsAfter.Where(s => s.Key < 1024), s => Assert.Equal(stampsBefore[s.Key], s.Value));
        Assert.All(stampsAfter.Where(s => s.Key >= 1024), s => Assert.True(s.Value > stampsBefore[s.Key]));
        Assert.Equal(0, (await service.RunAsync("blocks", all: false)).Cells);
    }

    private async Task<List<(int, double)>> LayerAsync(int datasetId) =>
        (await new StatisticsStore(database.DataSource).LayerAsync(datasetId, WaveParameter.Hs, AtlasPeriod.Annual, StatisticKind.P90,
            id => new Storage.Cells.CellRecord(id, null, null, 0, 0, null, true))).Select(v => (v.CellId, v.Value)).ToList();

    private async Task<Dictionary<int, DateTime>> ComputedAtAsync(int datasetId)
    {
        await using var command = database.DataSource.CreateCommand("SELECT cell_id, computed_at FROM cell_statistic_state WHERE dataset_id = $1");
        command.Parameters.AddWithValue(datasetId);
        var stamps = new Dictionary<int, DateTime>();
        await using var reader = await command.ExecuteReaderAsync();
        while (await reader.ReadAsync()) stamps[reader.GetInt32(0)] = reader.GetDateTime(1);
        return stamps;
    }

    // Statistics stored by an earlier version of the method (metadata without method_version, as every pass before
    // version 2 wrote it) are all recomputed by a plain pass, and the summary says why; the next pass is up to date.
    [Fact]
    public async Task StatisticsOfAnEarlierMethodAreAllRecomputed()
    {
        var file = FixtureFiles.Make("method.nc", 0, 24, $"--nx {Nx} --ny {Ny}");
        await new HindcastIngestor(database.DataSource).RunAsync(new IngestRequest("method", [file]));
        var service = new StatisticsService(database.DataSource);
        Assert.Equal(Nx * Ny - 1, (await service.RunAsync("method", all: false)).Cells);
        var dataset = (await new DatasetStore(database.DataSource).FindAsync("method"))!;
        Assert.Equal(Atlas.Statistics.MethodNotes.Version, StatisticsService.StoredMethodVersion(dataset.MetadataJson));

        await using (var downgrade = database.DataSource.CreateCommand(
            "UPDATE dataset SET metadata = metadata #- '{statistics,method_version}' WHERE dataset_id = $1"))
        {
            downgrade.Parameters.AddWithValue(dataset.Id);
            Assert.Equal(1, await downgrade.ExecuteNonQueryAsync());
        }
        var again = await service.RunAsync("method", all: false);
        Assert.Equal(Nx * Ny - 1, again.Cells);
        Assert.True(again.MethodChanged);
        Assert.Contains("earlier version of the method", again.Describe());
        Assert.Equal(0, (await service.RunAsync("method", all: false)).Cells);
    }
}
