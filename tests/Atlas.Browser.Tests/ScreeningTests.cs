using System.Globalization;
using System.Text.RegularExpressions;
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
        var cells = await SeaCells.LayerAsync(site.Http, "j", "mean", "annual");
        var power = cells.Select(c => c.Value).Order().ToArray();
        var minPower = F(Math.Floor(power[power.Length / 2]));

        await using var session = await site.OpenAsync();
        var page = session.Page;
        // The map as a person sees it before screening: every sea cell in its layer colour.
        await ShownLayer.WaitForLandAsync(page);
        await PageMap.NextFrameAsync(page);
        var plain = await PageMap.CanvasColoursAtAsync(page, cells);
        Assert.All(plain, rgba => Assert.Equal(255, rgba[3]));
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

        // The highlighted cells are exactly the API's, as the map shows them: the page paints the answer on the frame
        // after it adds the outline key to the colour bar; a highlighted cell keeps its layer colour, every other sea
        // cell is dimmed, and each highlighted cell is outlined in the colour of that key.
        await Assertions.Expect(page.Locator("#map-legend")).ToContainTextAsync("meets the screening criteria");
        await PageMap.NextFrameAsync(page);
        var screened = await PageMap.CanvasColoursAtAsync(page, cells);
        var highlighted = cells.Where((_, i) => SameColour(plain[i], screened[i])).Select(c => c.Id).Order().ToArray();
        var expected = api.GetProperty("features").EnumerateArray().Select(f => f.GetProperty("properties").GetProperty("cell_id").GetInt32()).Order().ToArray();
        Assert.Equal(expected, highlighted);
        var outline = await OutlineKeyColourAsync(page);
        // Along a line from each highlighted cell's centre to its western neighbour's, across the edge between them.
        var step = SeaCells.GridStep(cells, c => c.Lon);
        var westLines = cells.Where(c => expected.Contains(c.Id)).Select(c => (c.Lat, c.Lon, c.Lat, c.Lon - step)).ToArray();
        var westEdges = await PageMap.CanvasColoursAlongAsync(page, westLines);
        Assert.All(westEdges, line => Assert.Contains(line, rgba => IsOutline(rgba, outline)));

        // The download link is the same GeoJSON.
        var download = await page.RunAndWaitForDownloadAsync(() => page.ClickAsync("a[data-link='screen-geojson']"));
        Assert.EndsWith(".geojson", download.SuggestedFilename);
        var saved = await File.ReadAllTextAsync((await download.PathAsync())!);
        Assert.Contains("\"FeatureCollection\"", saved);

        await page.ScreenshotAsync(new PageScreenshotOptions { Path = Path.Combine(site.ScreenshotFolder, "wide-screening.png") });
        // Clearing takes the highlight off the map: the outline key goes, every sea cell has its layer colour again and
        // no outline is left.
        await page.ClickAsync("#screen-clear");
        await Assertions.Expect(page.Locator("#map-legend")).Not.ToContainTextAsync("meets the screening criteria");
        await PageMap.NextFrameAsync(page);
        var cleared = await PageMap.CanvasColoursAtAsync(page, cells);
        Assert.All(cells.Select((c, i) => (c.Id, Same: SameColour(plain[i], cleared[i]))), c => Assert.True(c.Same, $"cell {c.Id} is still dimmed"));
        var edgesAfter = await PageMap.CanvasColoursAlongAsync(page, westLines);
        Assert.All(edgesAfter, line => Assert.DoesNotContain(line, rgba => IsOutline(rgba, outline)));
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

    /// <summary>Two canvas pixels of the same colour (a cell's solid fill is painted identically each time).</summary>
    private static bool SameColour(int[] a, int[] b) => a.Zip(b).All(p => Math.Abs(p.First - p.Second) <= 1);

    /// <summary>
    /// A pixel of the outline: within 100 (Euclidean RGB) of its colour. The outline is 1.5 px wide over a white halo,
    /// so across an edge at least one pixel is three quarters outline (about 75 away); the layer's colour scale keeps
    /// far from it.
    /// </summary>
    private static bool IsOutline(int[] rgba, int[] outline) =>
        Math.Sqrt(Enumerable.Range(0, 3).Sum(k => Math.Pow(rgba[k] - outline[k], 2))) < 100;

    /// <summary>The colour of the outline as the colour bar's key shows it.</summary>
    private static async Task<int[]> OutlineKeyColourAsync(IPage page)
    {
        var css = await page.Locator("#map-legend .swatch.outline").EvaluateAsync<string>("e => getComputedStyle(e).borderTopColor");
        var rgb = Regex.Match(css, @"rgba?\((\d+), (\d+), (\d+)");
        Assert.True(rgb.Success, $"the outline key's colour is '{css}'");
        return [.. Enumerable.Range(1, 3).Select(g => int.Parse(rgb.Groups[g].Value, CultureInfo.InvariantCulture))];
    }
}
