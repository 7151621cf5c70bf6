using System.Globalization;
using System.Net;
using System.Text.Json;
using Atlas.Api.Model;
using Atlas.Api.Tests.Support;

namespace Atlas.Api.Tests;

[Collection(AtlasApiCollection.Name)]
public sealed class ScreeningApiTests(AtlasApiFixture atlas)
{
    private readonly HttpClient _client = atlas.Factory.CreateClient();
    private static readonly string Screen = $"/api/v1/datasets/{SyntheticAtlas.CoastSlug}/screen";

    [Fact]
    public async Task ScreeningReturnsTheCellsMeetingEveryCriterionWithTheirArea()
    {
        var root = JsonDocument.Parse(await _client.GetStringAsync($"{Screen}?min_power_kw_m=14&min_depth_m=40&max_depth_m=130&max_coast_distance_km=60&max_hs_p90_m=3.2")).RootElement;
        // Cross-check: the criteria evaluated on the NumPy statistics rows and cell columns directly in SQL.
        await using var command = atlas.DataSource.CreateCommand($"""
            SELECT array_agg(c.cell_id ORDER BY c.cell_id)
              FROM cell c JOIN dataset d ON d.dataset_id = c.dataset_id AND d.slug = '{SyntheticAtlas.CoastSlug}'
              JOIN cell_statistic j ON j.dataset_id = c.dataset_id AND j.cell_id = c.cell_id AND j.period = 0 AND j.parameter = 3
              JOIN cell_statistic h ON h.dataset_id = c.dataset_id AND h.cell_id = c.cell_id AND h.period = 0 AND h.parameter = 0
             WHERE c.wet AND j.mean >= 14 AND c.depth_m BETWEEN 40 AND 130 AND c.coast_distance_m <= 60000 AND h.p90 <= 3.2
            """);
        var expected = (int[])(await command.ExecuteScalarAsync())!;
        var ids = root.GetProperty("features").EnumerateArray().Select(f => f.GetProperty("id").GetInt32()).ToArray();
        Assert.NotEmpty(expected);
        Assert.True(expected.Length < 100);
        Assert.Equal(expected, ids);
        Assert.Equal(expected.Length, root.GetProperty("count").GetInt32());
        var areas = root.GetProperty("features").EnumerateArray().Sum(f => f.GetProperty("properties").GetProperty("area_km2").GetDouble());
        Assert.Equal(areas, root.GetProperty("total_area_km2").GetDouble(), 1e-3);
        Assert.Equal(AtlasCaution.Text, root.GetProperty("caution").GetString());
    }

    [Fact]
    public async Task ScreeningCsvHoldsTheSameCellsAndItsMetadataTheCriteriaAndTheCaution()
    {
        const string criteria = "min_power_kw_m=14&min_depth_m=40&max_depth_m=130&max_coast_distance_km=60&max_hs_p90_m=3.2";
        var root = JsonDocument.Parse(await _client.GetStringAsync($"{Screen}?{criteria}")).RootElement;
        // GDAL, pandas and the CSVW structure: see CsvDownloadCheck.
        var download = await CsvDownloadCheck.AssertAsync(_client, $"{Screen}?{criteria}&format=csv");
        Assert.Equal(["cell_id", "lon", "lat", "mean_power_kw_m", "hs_p90_m", "depth_m", "coast_distance_km", "area_km2"], download.Header);
        var ids = download.Csv.Split("\r\n", StringSplitOptions.RemoveEmptyEntries).Skip(1).Select(l => int.Parse(l.Split(',')[0], CultureInfo.InvariantCulture));
        Assert.Equal(root.GetProperty("features").EnumerateArray().Select(f => f.GetProperty("id").GetInt32()), ids);
        var description = download.Metadata.GetProperty("dc:description").GetString()!;
        Assert.Contains($"The {root.GetProperty("count").GetInt32()} wet cells", description);
        Assert.Contains("min_power_kw_m 14", description);
        Assert.Contains(root.GetProperty("total_area_km2").GetDouble().ToString(CultureInfo.InvariantCulture) + " km2", description);
        Assert.Equal("kW/m", CsvDownloadCheck.Unit(download.Metadata, "mean_power_kw_m"));
        await Problems.AssertAsync(await _client.GetAsync($"{Screen}?format=xlsx"), HttpStatusCode.BadRequest, "geojson or csv");
    }

    [Theory]
    [InlineData("min_depth_m=100&max_depth_m=20", "max_depth_m")]
    [InlineData("min_power_kw_m=lots", "min_power_kw_m")]
    [InlineData("max_hs_p90_m=-1", "max_hs_p90_m")]
    [InlineData("period=monsoon", "period")]
    public async Task InvalidCriteriaAreValidationProblemsNamingTheCriterion(string query, string field)
    {
        var problem = await Problems.AssertAsync(await _client.GetAsync($"{Screen}?{query}"), HttpStatusCode.BadRequest);
        Assert.True(problem.GetProperty("errors").TryGetProperty(field, out _), problem.ToString());
    }
}
