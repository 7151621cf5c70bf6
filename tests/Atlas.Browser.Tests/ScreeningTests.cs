using System.Globalization;
using Microsoft.Playwright;

namespace Atlas.Browser.Tests;

[Collection(AtlasSiteCollection.Name)]
public class ScreeningTests(AtlasSite site)
{
    private static string F(double v) => v.ToString("0.###", CultureInfo.InvariantCulture);

    [Fact]
    public async Task ScreeningShowsTheApisCountAreaAndCells()
    {
        // Criteria that some but not all cells meet: power above the median of the annual mean layer.
        var power = (await SeaCells.LayerAsync(site.Http, "j", "mean", "annual")).Select(c => c.Value).Order().ToArray();
        var minPower = F(Math.Floor(power[power.Length / 2]));

        await using var session = await site.OpenAsync();
        var page = session.Page;
        await page.FillAsync("input[name='min_power_kw_m']", minPower);
        await page.FillAsync("input[name='min_depth_m']", "10");
        await page.FillAsync("input[name='max_depth_m']", "400");
        await page.FillAsync("input[name='max_coast_distance_km']", "60");
        await page.FillAsync("input[name='max_hs_p90_m']", "");
        await page.ClickAsync("#screen-form button[type='submit']");
        await page.WaitForSelectorAsync("[data-field='screen-count']");

        var href = (await page.GetAttributeAsync("a[data-link='screen-geojson']", "href"))!;
        Assert.Contains($"min_power_kw_m={minPower}", href);
        var api = await PageMap.GetJsonAsync(site.Http, href);
        var count = api.GetProperty("count").GetInt32();
        Assert.InRange(count, 1, power.Length - 1);
        Assert.Equal(count, (int)ShownNumber.Parse((await page.TextContentAsync("[data-field='screen-count']"))!).Value);
        ShownNumber.Matches(api.GetProperty("total_area_km2").GetDouble(), (await page.TextContentAsync("[data-field='screen-area']"))!, "total area");

        // The highlighted cells are exactly the API's.
        var highlighted = await page.EvaluateAsync<int[]>("() => [...window.atlasPage.cells._highlight].sort((a, b) => a - b)");
        var expected = api.GetProperty("features").EnumerateArray().Select(f => f.GetProperty("properties").GetProperty("cell_id").GetInt32()).Order().ToArray();
        Assert.Equal(expected, highlighted);
        Assert.Contains("meets the screening criteria", await page.TextContentAsync("#map-legend"));

        // The download link is the same GeoJSON.
        var download = await page.RunAndWaitForDownloadAsync(() => page.ClickAsync("a[data-link='screen-geojson']"));
        Assert.EndsWith(".geojson", download.SuggestedFilename);
        var saved = await File.ReadAllTextAsync((await download.PathAsync())!);
        Assert.Contains("\"FeatureCollection\"", saved);

        await page.ScreenshotAsync(new PageScreenshotOptions { Path = Path.Combine(site.ScreenshotFolder, "wide-screening.png") });
        await page.ClickAsync("#screen-clear");
        Assert.Null(await page.EvaluateAsync<int[]?>("() => window.atlasPage.cells._highlight"));
        Assert.Empty(session.Errors);
    }

    [Fact]
    public async Task ReversedDepthWindowShowsTheApisProblem()
    {
        await using var session = await site.OpenAsync();
        var page = session.Page;
        await page.FillAsync("input[name='min_depth_m']", "300");
        await page.FillAsync("input[name='max_depth_m']", "20");
        await page.ClickAsync("#screen-form button[type='submit']");
        await page.WaitForSelectorAsync("#screen-result.error");
        Assert.Contains("reversed", await page.TextContentAsync("#screen-result"));
    }
}
