using System.Globalization;
using System.Text.RegularExpressions;
using Microsoft.Playwright;

namespace Atlas.Browser.Tests;

/// <summary>
/// The layer as a person sees it: its download links (written once the layer is painted), the facts line under
/// the selectors ("1,234 cells with a value, from ...") and the read-out under the colour bar of the cell the pointer
/// rests on. Waits use Playwright's auto-waiting assertions, which retry until the page shows the expected state (the
/// suite-wide limit is CI's, set in <see cref="AtlasSite"/>).
/// </summary>
public static class ShownLayer
{
    private static ILocator TifLink(IPage page) => page.Locator("#layer-downloads a[data-format='tif']");

    /// <summary>Waits until the page shows the layer of these three choices.</summary>
    public static Task WaitForAsync(IPage page, string parameter, string statistic, string period) =>
        Assertions.Expect(TifLink(page)).ToHaveAttributeAsync("href", $"/api/v1/datasets/{AtlasSite.Slug}/layers/{parameter}/{statistic}/{period}.tif");

    /// <summary>Waits until the page shows a layer of this parameter, whatever its statistic and period.</summary>
    public static Task WaitForParameterAsync(IPage page, string parameter) =>
        Assertions.Expect(TifLink(page)).ToHaveAttributeAsync("href", new Regex($"/layers/{Regex.Escape(parameter)}/[^/]+/[^/]+\\.tif$"));

    /// <summary>Waits until the land mask is drawn, as the person sees it: the colour bar gains its "land (dry cells)" key.</summary>
    public static Task WaitForLandAsync(IPage page) => Assertions.Expect(page.Locator("#map-legend .swatch.land")).ToBeVisibleAsync();

    /// <summary>
    /// The current layer's value of a cell with its unit, as the read-out under the colour bar shows it while the pointer
    /// rests on the cell's centre ("Under the pointer, cell 812: 31.4159 kW/m"). The read-out follows a new layer at once, so
    /// after <see cref="WaitForAsync"/> it shows the new layer's value for a pointer that has not moved.
    /// </summary>
    public static async Task<string> CellValueAsync(IPage page, LayerCell cell)
    {
        var (x, y) = await PageMap.PixelOfAsync(page, cell.Lat, cell.Lon);
        await page.Mouse.MoveAsync(x, y);
        var readout = page.Locator("#legend-readout");
        await Assertions.Expect(readout).ToContainTextAsync($"cell {cell.Id}:");
        return (await readout.Locator("[data-field='cell-value']").TextContentAsync())!;
    }

    /// <summary>The number of cells with a value, as the facts line shows it.</summary>
    public static async Task<int> CellsWithAValueAsync(IPage page)
    {
        var facts = (await page.TextContentAsync("#layer-facts"))!;
        var match = Regex.Match(facts, @"^([\d,]+) cells with a value");
        Assert.True(match.Success, $"the facts line shows no cell count: {facts}");
        // The page groups thousands with commas (en-GB); the tests run in invariant mode, whose group separator is
        // the same comma.
        return int.Parse(match.Groups[1].Value, NumberStyles.AllowThousands, CultureInfo.InvariantCulture);
    }
}
