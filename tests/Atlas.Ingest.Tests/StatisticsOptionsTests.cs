using Atlas.Ingest.Hosting;
using Atlas.Ingest.Ingestion;
using Atlas.Ingest.Statistics;
using Atlas.Statistics;
using Atlas.Storage.Datasets;
using Atlas.TestSupport;
using Atlas.WavePhysics;
using Microsoft.Extensions.Configuration;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Options;

namespace Atlas.Ingest.Tests;

/// <summary>
/// The statistics options come from the configuration section Statistics, are checked at start, and are recorded with
/// each pass; a pass with other options recomputes every cell and says so.
/// </summary>
public class StatisticsOptionsTests(TestDatabase database) : IClassFixture<TestDatabase>
{
    private static ServiceProvider Services(Dictionary<string, string?> settings) =>
        new ServiceCollection()
            .AddSingleton<IConfiguration>(new ConfigurationBuilder().AddInMemoryCollection(settings).Build())
            .AddStatisticsOptions()
            .BuildServiceProvider();

    [Fact]
    public void TheStatisticsSectionGivesTheOptionsAndAListReplacesTheDefaultList()
    {
        using var services = Services(new()
        {
            ["Statistics:HsThresholdsMetres:0"] = "0.5",
            ["Statistics:HsThresholdsMetres:1"] = "1.5",
            ["Statistics:LowCoverageThreshold"] = "0.6",
            ["Statistics:AssumedSpectrum"] = "PiersonMoskowitz",
            ["Statistics:HsBinning:BinWidth"] = "0.05",
            ["Statistics:PowerBinning:BinWidth"] = "0.5",
            ["Statistics:PowerBinning:UpperBound"] = "2000",
        });
        var options = services.GetRequiredService<StatisticsOptions>();
        Assert.Equal([0.5, 1.5], options.HsThresholdsMetres);
        Assert.Equal(new StatisticsOptions().PowerThresholdsKilowattsPerMetre, options.PowerThresholdsKilowattsPerMetre);
        Assert.Equal(0.6, options.LowCoverageThreshold);
        Assert.Equal(SpectrumShape.PiersonMoskowitz, options.AssumedSpectrum);
        Assert.Equal(new HistogramBinning(0.05, 30), options.HsBinning);
        Assert.Equal(new HistogramBinning(0.5, 2000), options.PowerBinning);
        Assert.Equal(HistogramBinning.DefaultPeriod, options.PeriodBinning);
        // The shared defaults are not touched by binding.
        Assert.Equal(0.01, HistogramBinning.DefaultHs.BinWidth);
    }

    [Theory]
    [InlineData("Statistics:HsBinning:BinWidth", "0.07", "HsBinning")]
    [InlineData("Statistics:LowCoverageThreshold", "1.5", "LowCoverageThreshold")]
    [InlineData("Statistics:HsThresholdsMetres:1", "0.5", "HsThresholdsMetres")]
    public void AWrongStatisticsSettingStopsTheStartNamingIt(string key, string value, string named)
    {
        var settings = new Dictionary<string, string?> { [key] = value };
        if (key.StartsWith("Statistics:HsThresholdsMetres")) settings["Statistics:HsThresholdsMetres:0"] = "2";
        using var services = Services(settings);
        var error = Assert.Throws<OptionsValidationException>(() => services.GetRequiredService<IStartupValidator>().Validate());
        Assert.Contains($"Statistics:{named}", string.Join("; ", error.Failures));
    }

    [Fact]
    public async Task APassRecordsItsOptionsAndAPassWithOtherOptionsRecomputesEveryCell()
    {
        const int nx = 6, ny = 5;
        var file = FixtureFiles.Make("options.nc", 0, 24, $"--nx {nx} --ny {ny}");
        await new HindcastIngestor(database.DataSource).RunAsync(new IngestRequest("options", [file]));
        var first = await new StatisticsService(database.DataSource).RunAsync("options", all: false);
        Assert.False(first.OptionsChanged);
        var datasets = new DatasetStore(database.DataSource);
        Assert.Equal(HistogramBinning.DefaultHs, RecordedStatisticsOptions.Read((await datasets.FindAsync("options"))!.MetadataJson)!.HsBinning);

        using var services = Services(new() { ["Statistics:HsBinning:BinWidth"] = "0.05", ["Statistics:HsThresholdsMetres:0"] = "0.5" });
        var configured = new StatisticsService(database.DataSource, services.GetRequiredService<StatisticsOptions>());
        var second = await configured.RunAsync("options", all: false);
        Assert.True(second.OptionsChanged);
        Assert.Equal(first.Cells, second.Cells);
        Assert.Contains("other statistics options", second.Describe());
        var recorded = RecordedStatisticsOptions.Read((await datasets.FindAsync("options"))!.MetadataJson)!;
        Assert.Equal(new HistogramBinning(0.05, 30), recorded.HsBinning);
        Assert.Equal([0.5], recorded.HsThresholdsMetres);

        Assert.Equal(0, (await configured.RunAsync("options", all: false)).Cells);
    }

    // A pass with other options that fails half-way leaves the stored options unknown, so the next pass recomputes
    // every cell even with the options recorded before it.
    [Fact]
    public async Task OptionsLeftUnknownByAnUnfinishedPassMakeTheNextPassRecomputeEveryCell()
    {
        var file = FixtureFiles.Make("unsettled.nc", 0, 24, "--nx 6 --ny 5");
        await new HindcastIngestor(database.DataSource).RunAsync(new IngestRequest("unsettled", [file]));
        var service = new StatisticsService(database.DataSource);
        var first = await service.RunAsync("unsettled", all: false);
        var datasets = new DatasetStore(database.DataSource);
        var dataset = (await datasets.FindAsync("unsettled"))!;
        await datasets.MergeMetadataAsync(dataset.Id, RecordedStatisticsOptions.Unsettled(dataset.MetadataJson));
        Assert.Null(RecordedStatisticsOptions.Read((await datasets.FindAsync("unsettled"))!.MetadataJson));

        var again = await service.RunAsync("unsettled", all: false);
        Assert.True(again.OptionsChanged);
        Assert.Equal(first.Cells, again.Cells);
        Assert.NotNull(RecordedStatisticsOptions.Read((await datasets.FindAsync("unsettled"))!.MetadataJson));
    }
}
