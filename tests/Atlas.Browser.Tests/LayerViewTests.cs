using Microsoft.Playwright;

namespace Atlas.Browser.Tests;

[Collection(AtlasSiteCollection.Name)]
public class LayerViewTests(AtlasSite site)
{
    private static Task<string> CanvasImageAsync(IPage page) =>
        page.EvaluateAsync<string>("() => document.querySelector('canvas.cell-canvas').toDataURL()");

    [Fact]
    public async Task SwitchingLayersRedrawsWithTheApisValues()
    {
        await using var session = await site.OpenAsync();
        var page = session.Page;
        var cell = await SeaCells.OffshoreAsync(site.Http);
        var draws = await PageMap.DrawsAsync(page);
        var before = await CanvasImageAsync(page);

        foreach (var (parameter, statistic, period, title) in new[]
                 {
                     ("hs", "p90", "annual", "significant wave height"),
                     ("hs", "p90", "djf", "winter"),
                     ("dir", "mean", "jan", "direction"),
                     ("tp", "mean", "y2022", "peak period"),
                 })
        {
            await page.SelectOptionAsync("#layer-parameter", parameter);
            await page.SelectOptionAsync("#layer-statistic", statistic);
            await page.SelectOptionAsync("#layer-period", period);
            await ShownLayer.WaitForAsync(page, parameter, statistic, period);
            Assert.Contains(title, (await page.TextContentAsync("#legend-title"))!, StringComparison.OrdinalIgnoreCase);

            var reference = await SeaCells.LayerAsync(site.Http, parameter, statistic, period);
            Assert.Equal(reference.Count, await ShownLayer.CellsWithAValueAsync(page));
            var expected = reference.Single(c => c.Id == cell.Id).Value;
            ShownNumber.MatchesTo(4, expected, await ShownLayer.CellValueAsync(page, cell), $"{parameter} {statistic} {period} of cell {cell.Id}");

            await page.WaitForFunctionAsync($"() => Number(document.querySelector('canvas.cell-canvas').dataset.draws) > {draws}");
            draws = await PageMap.DrawsAsync(page);
            var after = await CanvasImageAsync(page);
            Assert.NotEqual(before, after);
            before = after;

            // The download links follow the layer.
            var tif = await page.GetAttributeAsync("#layer-downloads a[data-format='tif']", "href");
            Assert.Equal($"/api/v1/datasets/{AtlasSite.Slug}/layers/{parameter}/{statistic}/{period}.tif", tif);
        }
        Assert.Empty(session.Errors);
    }

    [Fact]
    public async Task ColourBarShowsTheUnitAndTheRangeOfTheValues()
    {
        await using var session = await site.OpenAsync();
        var page = session.Page;
        await page.SelectOptionAsync("#layer-parameter", "hs");
        await ShownLayer.WaitForParameterAsync(page, "hs");
        var reference = await SeaCells.LayerAsync(site.Http, "hs", "mean", "annual");
        Assert.EndsWith("(m)", (await page.TextContentAsync("#legend-title"))!.Trim());
        // The colour range as the person sees it: the From and To boxes beside the colour bar.
        var lo = double.Parse(await page.InputValueAsync("#range-min"), System.Globalization.CultureInfo.InvariantCulture);
        var hi = double.Parse(await page.InputValueAsync("#range-max"), System.Globalization.CultureInfo.InvariantCulture);
        Assert.True(lo <= reference.Min(c => c.Value) && hi >= reference.Max(c => c.Value), $"colour range {lo}..{hi} does not cover the values");
        Assert.True(await page.Locator(".legend-ticks span").CountAsync() >= 3);
    }

    [Fact]
    public async Task LayerChoiceSurvivesAReloadThroughTheAddress()
    {
        await using var session = await site.OpenAsync(path: "/#p=te&s=p50&t=nov");
        var page = session.Page;
        await ShownLayer.WaitForParameterAsync(page, "te");
        Assert.Equal("p50", await page.InputValueAsync("#layer-statistic"));
        Assert.Equal("nov", await page.InputValueAsync("#layer-period"));
    }
}
