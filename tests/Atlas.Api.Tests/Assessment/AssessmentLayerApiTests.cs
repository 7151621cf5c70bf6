using System.Globalization;
using System.Net;
using System.Text.Json;
using Atlas.Api.Tests.Support;
using Atlas.Assessment.Access;
using Atlas.TestSupport;

namespace Atlas.Api.Tests.Assessment;

[Collection(AtlasApiCollection.Name)]
public sealed class AssessmentLayerApiTests(AtlasApiFixture atlas)
{
    private readonly HttpClient _client = atlas.Factory.CreateClient();
    private static string Layers => $"/api/v1/datasets/{SyntheticAtlas.CoastSlug}/layers";

    private async Task<double> PointEnergyAsync(int i, int j)
    {
        var query = $"/api/v1/datasets/{SyntheticAtlas.CoastSlug}/point/yield?{AssessmentAtlas.At(SyntheticAtlas.Latitude(j), SyntheticAtlas.Longitude(i))}&device=test-absorber";
        return (await AssessmentAtlas.JsonAsync(await _client.GetAsync(query))).GetProperty("annual_energy_mwh").GetDouble();
    }

    [Fact]
    public async Task YieldLayerValueEqualsThePointValueAtTheCell()
    {
        await YieldApiTests.EnsureDeviceAsync(atlas, "Test Absorber", YieldApiTests.AbsorberCsv());
        var layer = await AssessmentAtlas.JsonAsync(await _client.GetAsync($"{Layers}/yield/test-absorber.json"));
        var cells = layer.GetProperty("cells").EnumerateArray().ToDictionary(c => c.GetProperty("cell_id").GetInt32());
        Assert.Equal(SyntheticAtlas.FirstDryColumn * SyntheticAtlas.Ny, cells.Count);  // every wet cell
        foreach (var (i, j) in new[] { (5, 4), (3, 4), (0, 0), (9, 9) })
        {
            // The same library call on the same series: equal to 1e-12 relative.
            var expected = await PointEnergyAsync(i, j);
            Assert.Equal(expected, cells[SyntheticAtlas.CellId(i, j)].GetProperty("value").GetDouble(), expected * 1e-12);
            Assert.Equal(expected, cells[SyntheticAtlas.CellId(i, j)].GetProperty("annual_energy_mwh").GetDouble(), expected * 1e-12);
        }
        Assert.Equal("MWh/yr", layer.GetProperty("layer").GetProperty("units").GetString());
        Assert.Equal(Atlas.Api.Model.AtlasCaution.Text, layer.GetProperty("caution").GetString());
    }

    [Fact]
    public async Task YieldLayerCsvAndGeoJsonCarryEveryWetCellAndTheProvenance()
    {
        await YieldApiTests.EnsureDeviceAsync(atlas, "Test Absorber", YieldApiTests.AbsorberCsv());
        // GDAL, pandas and the CSVW structure: see CsvDownloadCheck.
        var download = await CsvDownloadCheck.AssertAsync(_client, $"{Layers}/yield/test-absorber.csv");
        Assert.Contains(SyntheticAtlas.SourceFileName, CsvDownloadCheck.SourceFiles(download.Metadata));
        Assert.Contains(Atlas.Api.Model.AtlasCaution.Text, CsvDownloadCheck.Notes(download.Metadata));
        Assert.Equal("MWh/yr", CsvDownloadCheck.Unit(download.Metadata, "annual_energy_mwh"));
        Assert.EndsWith("/yield/test-absorber.csv-metadata.json", download.MetadataUrl);
        var rows = download.Csv.Split("\r\n", StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal("cell_id,lon,lat,annual_energy_mwh,capacity_factor,outside_matrix_fraction,mean_power_kw", rows[0]);
        Assert.Equal(SyntheticAtlas.FirstDryColumn * SyntheticAtlas.Ny, rows.Length - 1);

        var response = await _client.GetAsync($"{Layers}/yield/test-absorber.geojson");
        Assert.Equal("application/geo+json", response.Content.Headers.ContentType?.MediaType);
        var geo = JsonDocument.Parse(await response.Content.ReadAsStringAsync()).RootElement;
        Assert.Equal("FeatureCollection", geo.GetProperty("type").GetString());
        var feature = geo.GetProperty("features").EnumerateArray().Single(f => f.GetProperty("id").GetInt32() == SyntheticAtlas.CellId(5, 4));
        Assert.Equal(SyntheticAtlas.Longitude(5), feature.GetProperty("geometry").GetProperty("coordinates")[0].GetDouble(), 7);
        Assert.Equal(await PointEnergyAsync(5, 4), feature.GetProperty("properties").GetProperty("value").GetDouble(), 1e-6);
        Assert.Equal(SyntheticAtlas.CoastSlug, geo.GetProperty("provenance").GetProperty("dataset").GetString());
    }

    [Fact]
    public async Task YieldLayerGeoTiffHoldsAtEachCellWhatGdalReads()
    {
        await YieldApiTests.EnsureDeviceAsync(atlas, "Test Absorber", YieldApiTests.AbsorberCsv());
        var path = ExternalTool.TempFile(".tif");
        await File.WriteAllBytesAsync(path, await _client.GetByteArrayAsync($"{Layers}/yield/test-absorber.tif"));
        foreach (var (i, j) in new[] { (5, 4), (1, 8) })
        {
            // GDAL's gdallocationinfo at the cell centre; the raster is Float32, so 1e-6 relative.
            var value = double.Parse(ExternalTool.Run("gdallocationinfo", "-valonly", "-wgs84", path,
                SyntheticAtlas.Longitude(i).ToString(CultureInfo.InvariantCulture), SyntheticAtlas.Latitude(j).ToString(CultureInfo.InvariantCulture)).Trim(), CultureInfo.InvariantCulture);
            var expected = await PointEnergyAsync(i, j);
            Assert.Equal(expected, value, expected * 1e-6);
        }
        var info = JsonDocument.Parse(ExternalTool.Run("gdalinfo", "-json", path)).RootElement;
        Assert.Equal(-9999, info.GetProperty("bands")[0].GetProperty("noDataValue").GetDouble());
        Assert.Contains("not a design basis", info.GetProperty("metadata").GetProperty("").GetProperty("caution").GetString());
    }

    [Theory]
    [InlineData(1.5, null, null)]
    [InlineData(2.0, 9.0, 12.0)]
    public async Task AccessibilityLayerEqualsTheLibraryAtACell(double hsMax, double? tpMax, double? hours)
    {
        var query = string.Create(CultureInfo.InvariantCulture, $"{Layers}/accessibility.json?hs_max={hsMax}{(tpMax is { } t ? $"&tp_max={t}" : "")}{(hours is { } h ? $"&hours={h}" : "")}");
        var layer = await AssessmentAtlas.JsonAsync(await _client.GetAsync(query));
        var cell = layer.GetProperty("cells").EnumerateArray().Single(c => c.GetProperty("cell_id").GetInt32() == SyntheticAtlas.CellId(3, 4));
        var (times, hs, _, tp, _) = AssessmentAtlas.CoastSeries(3, 4);
        var limits = new AccessLimits(hsMax, tpMax);
        // The library (Accessibility, WeatherWindowAnalysis) on the decoded series of that cell.
        var fraction = Accessibility.Of([.. hs.Select(v => (double)v)], tpMax is null ? [] : [.. tp.Select(v => (double)v)], limits).Fraction;
        Assert.Equal(fraction, cell.GetProperty("accessible_fraction").GetDouble(), 1e-12);
        if (hours is { } required)
        {
            var windows = WeatherWindowAnalysis.Analyse(AssessmentAtlas.Regular(times, hs), AssessmentAtlas.Regular(times, tp), limits, required);
            var probability = (double)windows.Months.Sum(m => m.WindowStartSteps) / windows.Months.Sum(m => m.DeterminedSteps);
            Assert.Equal(probability, cell.GetProperty("value").GetDouble(), 1e-12);
            Assert.Equal("window_start_probability", layer.GetProperty("layer").GetProperty("value").GetString());
        }
        else Assert.Equal(fraction, cell.GetProperty("value").GetDouble(), 1e-12);
    }

    [Fact]
    public async Task BadLayerRequestsAreProblems()
    {
        await YieldApiTests.EnsureDeviceAsync(atlas, "Test Absorber", YieldApiTests.AbsorberCsv());
        await Problems.AssertAsync(await _client.GetAsync($"{Layers}/yield/no-such-device.csv"), HttpStatusCode.NotFound, "no device");
        await Problems.AssertAsync(await _client.GetAsync($"{Layers}/yield/test-absorber.shp"), HttpStatusCode.NotFound, ".json, .csv, .geojson, .tif");
        await Problems.AssertAsync(await _client.GetAsync($"{Layers}/accessibility.csv"), HttpStatusCode.BadRequest, "hs_max is required");
        await Problems.AssertAsync(await _client.GetAsync($"/api/v1/datasets/no-such-run/layers/accessibility.csv?hs_max=2"), HttpStatusCode.NotFound);
        // The mesh test dataset stores statistics but no series.
        await Problems.AssertAsync(await _client.GetAsync($"/api/v1/datasets/{SyntheticAtlas.MeshSlug}/layers/accessibility.json?hs_max=2"), HttpStatusCode.UnprocessableEntity, "stores no series");
    }
}
