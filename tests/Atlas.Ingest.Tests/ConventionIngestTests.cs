using System.Text.Json;
using Atlas.Ingest.Ingestion;
using Atlas.Storage.Series;
using Atlas.TestSupport;

namespace Atlas.Ingest.Tests;

/// <summary>
/// Files written the way real model output writes them (peak frequency, a time-varying depth named "dpt" with
/// standard_name "depth", monthly files sharing their boundary step) and bad input (a time axis going backwards, a
/// negative depth at sea, a step given twice with different values). Every fixture is written by netCDF4-python through
/// tests/data/ingest/make_fixture.py, never copied from a product; expected values are the script's closed form
/// (<see cref="FixtureFiles.Expected"/>), values checked with ncdump when the script was written.
/// </summary>
public class ConventionIngestTests(TestDatabase database) : IClassFixture<TestDatabase>
{
    private const int Nx = 6, Ny = 5;

    private HindcastIngestor Ingestor => new(database.DataSource);

    [Fact]
    public async Task PeakFrequencyBecomesPeakPeriod()
    {
        var file = FixtureFiles.Make("conv-fp.nc", 0, 8, "--peak-frequency s-1");
        var summary = await Ingestor.RunAsync(new IngestRequest("conv-fp", [file]));
        var dataset = (await new Storage.Datasets.DatasetStore(database.DataSource).FindAsync("conv-fp"))!;
        var series = new SeriesStore(database.DataSource);
        foreach (var (j, i) in new[] { (1, 1), (3, 4), (4, 5) })
        {
            var tp = Decode((await series.ReadCellAsync(dataset.Id, j * Nx + i)).Single().Payload, WaveParameter.Tp);
            for (var s = 0; s < tp.Length; s++)
            {
                // fp = 0 at step 0 of (j=1, i=1): no period, a missing step.
                if (s == 0 && (j, i) == (1, 1)) { Assert.True(float.IsNaN(tp[s])); continue; }
                // Closed form of make_fixture.py: Tp = Te / 0.9, written as float32 fp = 1/Tp; stored to 0.01 s.
                Assert.Equal(FixtureFiles.Expected(3.0 * s, j, i).Tp, tp[s], 0.006);
            }
        }
        var text = summary.Describe();
        Assert.Contains("tp: from 'fp' (standard_name 'sea_surface_wave_peak_frequency'), converted Tp = 1/fp (peak frequency, s-1)", text);
        var tpEntry = Assumption(dataset.MetadataJson, "tp");
        Assert.Equal("fp", tpEntry.GetProperty("source").GetString());
        Assert.Contains("Tp = 1/fp", tpEntry.GetProperty("conversion").GetString());
    }

    [Fact]
    public async Task TimeVaryingDepthNamedDptIsStoredAsItsTimeMean()
    {
        // dpt(time, lat, lon), standard_name "depth", cm, positive = "up": -(depth + tide) * 100 with a tide of -0.5 m and
        // +0.5 m at alternate steps; the mean over 8 steps is the static depth 5 + 10 i m of the closed form.
        var file = FixtureFiles.Make("conv-dpt.nc", 0, 8, "--depth-name dpt --depth-standard-name depth --depth-time --depth-units cm --depth-positive up");
        var summary = await Ingestor.RunAsync(new IngestRequest("conv-dpt", [file]));
        var dataset = (await new Storage.Datasets.DatasetStore(database.DataSource).FindAsync("conv-dpt"))!;
        var cells = await new Storage.Cells.CellStore(database.DataSource).AllAsync(dataset.Id);
        foreach (var cell in cells.Where(c => c.CellId != 0))
            Assert.Equal(5.0 + 10.0 * (cell.CellId % Nx), cell.DepthMetres!.Value, 3);
        Assert.Null(cells.Single(c => c.CellId == 0).DepthMetres);
        Assert.Contains("depth: from 'dpt' (standard_name 'depth'), time-varying, time mean of 8 steps used; units 'cm' to m (x 0.01); positive up", summary.Describe());
        Assert.Equal("dpt", Assumption(dataset.MetadataJson, "depth").GetProperty("source").GetString());
    }

    [Fact]
    public async Task AnAdditionKeepsTheDepthEntryOfTheFirstLoad()
    {
        // Cell depths are written by the first load only; a later month must not restate them from its own file.
        var january = FixtureFiles.Make("conv-keep-a.nc", 0, 8, "--depth-name dpt --depth-standard-name depth --depth-time");
        var february = FixtureFiles.Make("conv-keep-b.nc", 31 * 24, 4, "--depth-name dpt --depth-standard-name depth --depth-time");
        await Ingestor.RunAsync(new IngestRequest("conv-keep", [january]));
        var added = await Ingestor.RunAsync(new IngestRequest("conv-keep", [february]));
        Assert.Contains("depth: from 'dpt' (standard_name 'depth'), time-varying, time mean of 8 steps used", added.Describe());
        var dataset = (await new Storage.Datasets.DatasetStore(database.DataSource).FindAsync("conv-keep"))!;
        Assert.Contains("time mean of 8 steps", Assumption(dataset.MetadataJson, "depth").GetProperty("conversion").GetString());
    }

    [Fact]
    public async Task WithoutDepthTheSummaryCountsTheDeepWaterCellsAndNamesTheLookalike()
    {
        var file = FixtureFiles.Make("conv-nodepth.nc", 0, 4, "--depth-name dpt --depth-standard-name none --depth-units \"\"");
        var summary = await Ingestor.RunAsync(new IngestRequest("conv-nodepth", [file]));
        Assert.Contains("depth: none found; deep water assumed in 29 cells (variable 'dpt' looks like depth but it has no units: " +
                        "map it with {\"depth\": \"dpt\"} and give its units under \"units\")", summary.Describe());
        var dataset = (await new Storage.Datasets.DatasetStore(database.DataSource).FindAsync("conv-nodepth"))!;
        var depth = Assumption(dataset.MetadataJson, "depth");
        Assert.Equal(JsonValueKind.Null, depth.GetProperty("source").ValueKind);
        Assert.StartsWith("deep water assumed in 29 cells", depth.GetProperty("assumed").GetString());
    }

    [Fact]
    public async Task TheMappingHintOfTheSummaryLoadsTheLookalikeDepth()
    {
        // The look-alike of the test above, named as the summary advises: {"depth": "dpt"} with its units.
        var file = FixtureFiles.Make("conv-mapped.nc", 0, 4, "--depth-name dpt --depth-standard-name none --depth-units \"\"");
        var mapping = Hindcast.VariableMapping.Parse("""{ "depth": "dpt", "units": { "depth": "m" } }""", "site.json");
        var summary = await Ingestor.RunAsync(new IngestRequest("conv-mapped", [file], Mapping: mapping));
        Assert.Contains("depth: from 'dpt' (the mapping file), static", summary.Describe());
        var dataset = (await new Storage.Datasets.DatasetStore(database.DataSource).FindAsync("conv-mapped"))!;
        var cells = await new Storage.Cells.CellStore(database.DataSource).AllAsync(dataset.Id);
        // Closed form of make_fixture.py: 5 + 10 i m.
        Assert.Equal(25.0, cells.Single(c => c.CellId == 1 * Nx + 2).DepthMetres!.Value, 3);
    }

    [Fact]
    public async Task WithoutTeTheSummaryStatesTheRatioTheStatisticsUse()
    {
        var file = FixtureFiles.Make("conv-note.nc", 0, 4, "--no-te");
        var summary = await Ingestor.RunAsync(new IngestRequest("conv-note", [file]));
        // Te = 0.9 Tp for JONSWAP gamma 3.3: IEC TS 62600-101 practice as listed in tests/data/README.md (common practice),
        // and the default of StatisticsOptions.AssumedSpectrum.
        Assert.Contains("te: none found; Te = 0.9 Tp assumed (JONSWAP, gamma 3.3)", summary.Describe());
        foreach (var symbol in new[] { "hs", "te", "tp", "dir", "spread", "depth" })
            Assert.Contains($"\n  {symbol}: ", summary.Describe());
    }

    [Fact]
    public async Task ANegativeDepthAtSeaIsRefusedNamingFileVariableAndCell()
    {
        var file = FixtureFiles.Make("conv-negative-depth.nc", 0, 4, "--negative-depth");
        var error = await Assert.ThrowsAsync<IngestException>(() => Ingestor.RunAsync(new IngestRequest("conv-negative-depth", [file])));
        Assert.Contains("conv-negative-depth.nc", error.Message);
        Assert.Contains("variable 'depth'", error.Message);
        Assert.Contains("cell 15 (i=3, j=2", error.Message);
        Assert.Contains("-4 m", error.Message);
        Assert.Null(await new Storage.Datasets.DatasetStore(database.DataSource).FindAsync("conv-negative-depth"));
    }

    [Fact]
    public async Task ANegativeDepthGivenAsAnElevationIsRefusedAfterSignHandling()
    {
        // positive = "up": the script writes -depth, so the -4 m depth is a +4 m elevation.
        var file = FixtureFiles.Make("conv-negative-up.nc", 0, 4, "--negative-depth --depth-name dpt --depth-standard-name none --depth-positive up");
        var error = await Assert.ThrowsAsync<IngestException>(() => Ingestor.RunAsync(new IngestRequest("conv-negative-up", [file])));
        Assert.Contains("variable 'dpt'", error.Message);
        Assert.Contains("cell 15", error.Message);
        Assert.Null(await new Storage.Datasets.DatasetStore(database.DataSource).FindAsync("conv-negative-up"));
    }

    [Fact]
    public async Task MonthlyFilesSharingTheirBoundaryStepLoadWithoutReplaceAndStoreItOnce()
    {
        // January's file ends at 21:00 on day 1 and February's starts there, with the same (closed-form) values.
        var first = FixtureFiles.Make("conv-share-a.nc", 0, 8);
        var second = FixtureFiles.Make("conv-share-b.nc", 21, 8);
        await Ingestor.RunAsync(new IngestRequest("conv-share", [first]));
        var summary = await Ingestor.RunAsync(new IngestRequest("conv-share", [second]));
        Assert.Equal(1, summary.SharedSteps);
        Assert.Contains("1 step(s) given twice with identical values were stored once", summary.Describe());
        var dataset = (await new Storage.Datasets.DatasetStore(database.DataSource).FindAsync("conv-share"))!;
        var timeline = (await new Storage.Datasets.DatasetStore(database.DataSource).TimelinesAsync(dataset.Id))[2020];
        Assert.Equal(15, timeline.Length);
        var hs = Decode((await new SeriesStore(database.DataSource).ReadCellAsync(dataset.Id, 2 * Nx + 3)).Single().Payload, WaveParameter.Hs);
        for (var s = 0; s < 15; s++) Assert.Equal(FixtureFiles.Expected(3.0 * s, 2, 3).Hs, hs[s], 0.0006);
    }

    [Fact]
    public async Task FilesSharingABoundaryStepLoadTogether()
    {
        var first = FixtureFiles.Make("conv-together-a.nc", 0, 8);
        var second = FixtureFiles.Make("conv-together-b.nc", 21, 8);
        var summary = await Ingestor.RunAsync(new IngestRequest("conv-together", [second, first]));
        Assert.Equal(1, summary.SharedSteps);
        var dataset = (await new Storage.Datasets.DatasetStore(database.DataSource).FindAsync("conv-together"))!;
        Assert.Equal(15, (await new Storage.Datasets.DatasetStore(database.DataSource).TimelinesAsync(dataset.Id))[2020].Length);
    }

    [Fact]
    public async Task ASharedStepWithDifferentValuesIsRefusedNamingStepVariableAndLargestDifference()
    {
        var first = FixtureFiles.Make("conv-differ-a.nc", 0, 8);
        var second = FixtureFiles.Make("conv-differ-b.nc", 21, 8, "--hs-offset 0.25");
        await Ingestor.RunAsync(new IngestRequest("conv-differ", [first]));
        var before = await IngestCounts.OfAsync(database, "conv-differ");
        var error = await Assert.ThrowsAsync<IngestException>(() => Ingestor.RunAsync(new IngestRequest("conv-differ", [second])));
        Assert.Contains("conv-differ-b.nc", error.Message);
        Assert.Contains("2020-01-01T21:00:00Z", error.Message);
        Assert.Contains("variable 'hs'", error.Message);
        // The offset is 0.25 m everywhere; stored to 1 mm.
        Assert.Contains("a difference of 0.25 m", error.Message);
        Assert.Contains("Nothing was changed", error.Message);
        Assert.Equal(before, await IngestCounts.OfAsync(database, "conv-differ"));
    }

    [Fact]
    public async Task TwoFilesGivingOneStepWithDifferentValuesAreRefusedTogether()
    {
        var first = FixtureFiles.Make("conv-pair-a.nc", 0, 8);
        var second = FixtureFiles.Make("conv-pair-b.nc", 21, 8, "--hs-offset -0.5");
        var error = await Assert.ThrowsAsync<IngestException>(() =>
            Ingestor.RunAsync(new IngestRequest("conv-pair", [first, second], ReplaceOverlap: true)));
        Assert.Contains("2020-01-01T21:00:00Z", error.Message);
        Assert.Contains("conv-pair-a.nc", error.Message);
        Assert.Contains("a difference of 0.5 m", error.Message);
        Assert.Null(await new Storage.Datasets.DatasetStore(database.DataSource).FindAsync("conv-pair"));
    }

    [Fact]
    public async Task ATimeAxisGoingBackwardsIsRefusedNamingFileVariableStepAndTimes()
    {
        // Steps 1 and 2 swapped: 03:00 comes after 06:00.
        var file = FixtureFiles.Make("conv-backwards.nc", 0, 6, "--backwards");
        var error = await Assert.ThrowsAnyAsync<Exception>(() => Ingestor.RunAsync(new IngestRequest("conv-backwards", [file])));
        Assert.Contains("conv-backwards.nc", error.Message);
        Assert.Contains("variable 'time'", error.Message);
        Assert.Contains("time[2] = 2020-01-01T03:00:00Z is before time[1] = 2020-01-01T06:00:00Z", error.Message);
        Assert.Null(await new Storage.Datasets.DatasetStore(database.DataSource).FindAsync("conv-backwards"));
    }

    [Fact]
    public async Task ARecordShorterThanOneMonthIsLoadedWithALowCoverageWarning()
    {
        var file = FixtureFiles.Make("conv-short.nc", 0, 8);
        var summary = await Ingestor.RunAsync(new IngestRequest("conv-short", [file]));
        Assert.Contains("warning: the record spans 2020-01-01T00:00:00Z to 2020-01-01T21:00:00Z, shorter than one month", summary.Describe());
        var dataset = (await new Storage.Datasets.DatasetStore(database.DataSource).FindAsync("conv-short"))!;
        using var metadata = JsonDocument.Parse(dataset.MetadataJson);
        Assert.Contains("low coverage", metadata.RootElement.GetProperty("warnings")[0].GetString());

        // A whole month of 3-hourly steps (248 steps, 1 January to 31 January 21:00) carries no warning.
        var month = FixtureFiles.Make("conv-month.nc", 0, 248);
        var whole = await Ingestor.RunAsync(new IngestRequest("conv-month", [month]));
        Assert.Empty(whole.Warnings);
    }

    private static float[] Decode(byte[] payload, WaveParameter variable)
    {
        var values = new float[SeriesCodec.StepCountOf(payload)];
        SeriesCodec.Decode(payload, variable, values);
        return values;
    }

    private static JsonElement Assumption(string metadataJson, string variable)
    {
        using var document = JsonDocument.Parse(metadataJson);
        return document.RootElement.GetProperty("assumptions").EnumerateArray()
            .Single(e => e.GetProperty("variable").GetString() == variable).Clone();
    }
}
