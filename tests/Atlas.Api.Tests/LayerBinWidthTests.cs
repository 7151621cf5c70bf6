using System.Text.Json;
using Atlas.Api.Tests.Support;
using Atlas.Ingest.Hosting;
using Atlas.Ingest.Statistics;
using Atlas.Statistics;
using Microsoft.Extensions.Configuration;
using Microsoft.Extensions.DependencyInjection;
using Atlas.TestSupport;

namespace Atlas.Api.Tests;

/// <summary>
/// Layers report the histogram bins and exceedance thresholds of the pass that computed them (recorded with the
/// dataset's statistics), not the server's defaults: a dataset whose pass ran with other bins from configuration lists
/// those bins, and its GeoTIFF, NetCDF and CSV downloads state them in their method notes.
/// </summary>
[Collection(AtlasApiCollection.Name)]
public sealed class LayerBinWidthTests(AtlasApiFixture atlas)
{
    private const string Slug = "test-coast-bins";
    private readonly HttpClient _client = atlas.Factory.CreateClient();
    private static readonly SemaphoreSlim Seeding = new(1, 1);
    private static bool _seeded;

    /// <summary>The synthetic coast again, its statistics computed with Statistics settings as a host binds them.</summary>
    private async Task SeedAsync()
    {
        await Seeding.WaitAsync();
        try
        {
            if (_seeded) return;
            await SyntheticAtlas.SeedCoastAsync(atlas.DataSource, Slug);
            var configuration = new ConfigurationBuilder().AddInMemoryCollection(new Dictionary<string, string?>
            {
                ["Statistics:HsBinning:BinWidth"] = "0.05",
                ["Statistics:PeriodBinning:BinWidth"] = "0.1",
                ["Statistics:PowerBinning:BinWidth"] = "0.5",
                ["Statistics:HsThresholdsMetres:0"] = "0.5",
                ["Statistics:HsThresholdsMetres:1"] = "1.5",
            }).Build();
            await using var services = new ServiceCollection().AddSingleton<IConfiguration>(configuration).AddStatisticsOptions().BuildServiceProvider();
            await new StatisticsService(atlas.DataSource, services.GetRequiredService<StatisticsOptions>()).RunAsync(Slug, all: true);
            _seeded = true;
        }
        finally { Seeding.Release(); }
    }

    [Fact]
    public async Task TheLayerListGivesTheBinWidthsOfThePassNotTheDefaults()
    {
        await SeedAsync();
        var root = JsonDocument.Parse(await _client.GetStringAsync($"/api/v1/datasets/{Slug}/layers")).RootElement;
        double? Width(string symbol) => root.GetProperty("parameters").EnumerateArray().Single(p => p.GetProperty("symbol").GetString() == symbol)
            .GetProperty("percentile_bin_width") is { ValueKind: JsonValueKind.Number } w ? w.GetDouble() : null;
        Assert.Equal(0.05, Width("hs"));
        Assert.Equal(0.1, Width("te"));
        Assert.Equal(0.1, Width("tp"));
        Assert.Equal(0.5, Width("j"));
        Assert.Equal(HistogramBinning.DefaultSpread.BinWidth, Width("spread"));
        Assert.Null(Width("dir"));
        // The dataset computed with the defaults still lists the defaults.
        var service = JsonDocument.Parse(await _client.GetStringAsync($"/api/v1/datasets/{SyntheticAtlas.ServiceSlug}/layers")).RootElement;
        Assert.Equal(HistogramBinning.DefaultHs.BinWidth,
            service.GetProperty("parameters").EnumerateArray().Single(p => p.GetProperty("symbol").GetString() == "hs").GetProperty("percentile_bin_width").GetDouble());
    }

    [Fact]
    public async Task DownloadsStateTheBinsAndThresholdsOfThePass()
    {
        await SeedAsync();
        const string bins = "Hs 0.05 m, Te/Tp 0.1 s, J 0.5 kW/m, spread 0.1 degree";
        const string thresholds = "Hs 0.5, 1.5 m; J 5, 10, 20, 30, 50, 75, 100 kW/m";

        var metadata = JsonDocument.Parse(await _client.GetStringAsync($"/api/v1/datasets/{Slug}/layers/hs/p90/annual.csv-metadata.json")).RootElement;
        var method = metadata.GetProperty("dc:provenance").GetString()!;
        Assert.Contains(bins, method);
        Assert.Contains(thresholds, method);

        // Read back by the reference tools: GDAL for the GeoTIFF, netCDF-C's ncdump for the NetCDF.
        var tif = ExternalTool.TempFile(".tif");
        var nc = ExternalTool.TempFile(".nc");
        try
        {
            await File.WriteAllBytesAsync(tif, await _client.GetByteArrayAsync($"/api/v1/datasets/{Slug}/layers/hs/p90/annual.tif"));
            var info = ExternalTool.Run("gdalinfo", "-mdd", "all", tif);
            Assert.Contains(bins, info);
            Assert.Contains(thresholds, info);
            await File.WriteAllBytesAsync(nc, await _client.GetByteArrayAsync($"/api/v1/datasets/{Slug}/layers/hs/p90/annual.nc"));
            var header = ExternalTool.Run("ncdump", "-h", nc);
            Assert.Contains(bins, header);
            Assert.Contains(thresholds, header);
        }
        finally
        {
            File.Delete(tif);
            File.Delete(nc);
        }
    }
}
