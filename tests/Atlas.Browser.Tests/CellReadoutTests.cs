using Microsoft.Playwright;

namespace Atlas.Browser.Tests;

[Collection(AtlasSiteCollection.Name)]
public class CellReadoutTests(AtlasSite site)
{
    [Fact]
    public async Task ArrowKeysOnTheFocusedMapReadTheCellAtTheMapCentre()
    {
        await using var session = await site.OpenAsync();
        var page = session.Page;
        var cells = await SeaCells.LayerAsync(site.Http, "j", "mean", "annual");
        var start = await SeaCells.OffshoreAsync(site.Http);
        await page.EvaluateAsync("([lat, lon]) => window.atlasPage.map.setView([lat, lon], window.atlasPage.map.getZoom(), { animate: false })",
            new[] { start.Lat, start.Lon });
        await page.FocusAsync("#map");
        await page.Keyboard.PressAsync("ArrowLeft");
        var readout = page.Locator("#legend-readout");
        await Assertions.Expect(readout).ToContainTextAsync("At the map centre, cell ");

        // The cell whose footprint holds the map centre after the move: on this regular grid, the centre nearest in
        // steps of the grid along each axis.
        var centre = await page.EvaluateAsync<double[]>("() => { const c = window.atlasPage.map.getCenter(); return [c.lat, c.lng]; }");
        double lonStep = SeaCells.GridStep(cells, c => c.Lon), latStep = SeaCells.GridStep(cells, c => c.Lat);
        var expected = cells.MinBy(c => Math.Max(Math.Abs(c.Lon - centre[1]) / lonStep, Math.Abs(c.Lat - centre[0]) / latStep))!;
        Assert.NotEqual(start.Id, expected.Id);
        await Assertions.Expect(readout).ToContainTextAsync($"At the map centre, cell {expected.Id}:");
        ShownNumber.MatchesTo(4, expected.Value, (await readout.Locator("[data-field='cell-value']").TextContentAsync())!, $"cell {expected.Id}");
        Assert.Empty(session.Errors);
    }
}
