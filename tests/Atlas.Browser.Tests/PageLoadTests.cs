using Microsoft.Playwright;

namespace Atlas.Browser.Tests;

[Collection(AtlasSiteCollection.Name)]
public class PageLoadTests(AtlasSite site)
{
    [Fact]
    public async Task PageLoadsTheDemoWithoutConsoleErrors()
    {
        await using var session = await site.OpenAsync();
        var page = session.Page;
        await ShownLayer.WaitForLandAsync(page);
        await page.WaitForFunctionAsync("() => Number(document.querySelector('canvas.cell-canvas').dataset.draws) > 0");

        Assert.Empty(session.Errors);
        Assert.Contains("Browser test coast", await page.TextContentAsync("#dataset-title"));
        Assert.True(await page.Locator("canvas.cell-canvas").IsVisibleAsync());
        Assert.Contains("kW/m", await page.TextContentAsync("#legend-title"));

        // The page draws the sea cells in colour: an offshore cell is opaque on the canvas.
        var cell = await SeaCells.OffshoreAsync(site.Http);
        var rgba = await PageMap.CanvasColourAtAsync(page, cell.Lat, cell.Lon);
        Assert.Equal(255, rgba[3]);

        // Every sea cell of the API's layer is on the map, with the API's value.
        var layer = await SeaCells.LayerAsync(site.Http, "j", "mean", "annual");
        var drawn = await ShownLayer.CellsWithAValueAsync(page);
        Assert.Equal(layer.Count, drawn);
        // The value the read-out under the colour bar shows for the cell under the pointer, with the layer's unit.
        var shown = await ShownLayer.CellValueAsync(page, cell);
        ShownNumber.MatchesTo(4, cell.Value, shown, $"cell {cell.Id}");
        Assert.EndsWith(" kW/m", shown);

        await page.ScreenshotAsync(new PageScreenshotOptions { Path = Path.Combine(site.ScreenshotFolder, "wide-layer.png") });
    }

    [Fact]
    public async Task CautionTextIsVisibleAndIsTheApisOwn()
    {
        await using var session = await site.OpenAsync();
        var datasets = await PageMap.GetJsonAsync(site.Http, "/api/v1/datasets");
        var caution = datasets.GetProperty("caution").GetString()!;
        Assert.Contains("not a design basis", caution);
        var shown = session.Page.Locator("#caution");
        Assert.True(await shown.IsVisibleAsync());
        Assert.Contains(caution, await shown.TextContentAsync());
        var box = await shown.BoundingBoxAsync();
        Assert.NotNull(box);
        Assert.True(box.Y < 120, $"the caution sits {box.Y} px down; it belongs at the top of the page");
    }

    [Fact]
    public async Task LandMaskIsTheDatasetsDryCells()
    {
        await using var session = await site.OpenAsync();
        var page = session.Page;
        await ShownLayer.WaitForLandAsync(page);
        var land = await PageMap.GetJsonAsync(site.Http, $"/api/v1/datasets/{AtlasSite.Slug}/land");
        var detail = await PageMap.GetJsonAsync(site.Http, $"/api/v1/datasets/{AtlasSite.Slug}");
        // Every grid cell is either wet or dry: the land mask holds exactly the cells that are not sea.
        Assert.Equal(detail.GetProperty("point_count").GetInt32() - detail.GetProperty("wet_cell_count").GetInt32(),
            land.GetProperty("dry_cell_count").GetInt32());
        Assert.Empty(session.Errors);
    }
}
