using System.Net.Http.Json;
using System.Text.Json;
using Microsoft.Playwright;

namespace Atlas.Browser.Tests;

[Collection(AtlasSiteCollection.Name)]
public class AreaTests(AtlasSite site)
{
    private async Task<JsonElement> PostAreaAsync(string geometryJson, string query)
    {
        using var content = new StringContent(geometryJson, System.Text.Encoding.UTF8, "application/geo+json");
        using var response = await site.Http.PostAsync($"/api/v1/datasets/{AtlasSite.Slug}/area?{query}", content);
        Assert.True(response.IsSuccessStatusCode, await response.Content.ReadAsStringAsync());
        return (await response.Content.ReadFromJsonAsync<JsonElement>());
    }

    private static async Task<string> ShownAsync(IPage page, string term) =>
        (await page.Locator($"[data-field='area-stats'] dt:text-is('{term}') + dd").TextContentAsync())!;

    [Fact]
    public async Task DrawnPolygonGivesTheApisAreaStatistics()
    {
        await using var session = await site.OpenAsync();
        var page = session.Page;
        var cell = await SeaCells.OffshoreAsync(site.Http);
        await page.ClickAsync("#area-draw");
        var (x, y) = await PageMap.PixelOfAsync(page, cell.Lat, cell.Lon);
        foreach (var (dx, dy) in new[] { (-60, -50), (60, -50), (70, 40), (-50, 55) }) await page.Mouse.ClickAsync(x + dx, y + dy);
        // The polygon as the page sends it to the API (what crosses the wire, not the page's own state).
        var sent = await page.RunAndWaitForRequestAsync(() => page.ClickAsync("#area-finish"),
            request => request.Method == "POST" && request.Url.Contains("/area", StringComparison.Ordinal));
        await page.WaitForSelectorAsync("[data-field='area-stats']");

        var geometry = sent.PostData ?? throw new InvalidOperationException("The page posted no polygon.");
        var api = await PostAreaAsync(geometry, "parameter=j&statistic=mean&period=annual");
        Assert.Contains($"{api.GetProperty("cell_count").GetInt32()} (", await ShownAsync(page, "Cells inside"));
        ShownNumber.Matches(api.GetProperty("mean").GetDouble(), await ShownAsync(page, "Mean"), "area mean");
        ShownNumber.Matches(api.GetProperty("area_weighted_mean").GetDouble(), await ShownAsync(page, "Area-weighted mean"), "area-weighted mean");
        ShownNumber.Matches(api.GetProperty("area_km2").GetDouble(), await ShownAsync(page, "Polygon area"), "polygon area");

        // Changing the layer recomputes the same area for it.
        await page.SelectOptionAsync("#layer-parameter", "hs");
        await page.WaitForSelectorAsync("[data-field='area-stats'] >> xpath=.. >> text=hs mean");
        var hs = await PostAreaAsync(geometry, "parameter=hs&statistic=mean&period=annual");
        ShownNumber.Matches(hs.GetProperty("mean").GetDouble(), await ShownAsync(page, "Mean"), "area mean of hs");
        Assert.Empty(session.Errors);
        await page.ScreenshotAsync(new PageScreenshotOptions { Path = Path.Combine(site.ScreenshotFolder, "wide-area.png") });
    }

    [Fact]
    public async Task UploadedGeoJsonGivesTheApisAreaStatistics()
    {
        var cells = await SeaCells.LayerAsync(site.Http, "j", "mean", "annual");
        var cell = await SeaCells.OffshoreAsync(site.Http);
        const double half = 0.12;
        var ring = new[] { (-half, -half), (half, -half), (half, half), (-half, half), (-half, -half) }
            .Select(d => new[] { Math.Round(cell.Lon + d.Item1 * 2, 5), Math.Round(cell.Lat + d.Item2, 5) }).ToArray();
        var feature = JsonSerializer.Serialize(new
        {
            type = "FeatureCollection",
            features = new[] { new { type = "Feature", properties = new { name = "test area" }, geometry = new { type = "Polygon", coordinates = new[] { ring } } } },
        });
        var file = Path.Combine(Path.GetTempPath(), $"atlas-area-{Guid.NewGuid():N}.geojson");
        await File.WriteAllTextAsync(file, feature);
        try
        {
            await using var session = await site.OpenAsync();
            var page = session.Page;
            await page.FillAsync("#area-threshold", "20");
            await page.SetInputFilesAsync("#area-upload", file);
            await page.WaitForSelectorAsync("[data-field='area-stats']");
            var api = await PostAreaAsync(JsonSerializer.Serialize(new { type = "Polygon", coordinates = new[] { ring } }),
                "parameter=j&statistic=mean&period=annual&threshold=20");
            Assert.True(api.GetProperty("cell_count").GetInt32() > 1);
            Assert.True(api.GetProperty("cell_count").GetInt32() < cells.Count);
            ShownNumber.Matches(api.GetProperty("mean").GetDouble(), await ShownAsync(page, "Mean"), "area mean");
            Assert.Contains($"{api.GetProperty("cells_above_threshold").GetInt32()} cells", await ShownAsync(page, "Above 20.0 kW/m"));
            Assert.Empty(session.Errors);
        }
        finally
        {
            File.Delete(file);
        }
    }
}
