using Atlas.Api.Downloads;
using Microsoft.Playwright;
using SkiaSharp;

namespace Atlas.Browser.Tests;

/// <summary>
/// The page draws with the server's colour scales: the colour bar a person sees under the map, read from its pixels
/// at the stops of its gradient (fractions k/16), equals the table the PNG and vector figures are drawn with
/// (ColourScale, DirectionColourScale), for a sequential layer and for a direction layer.
/// </summary>
[Collection(AtlasSiteCollection.Name)]
public class ColourBarTests(AtlasSite site)
{
    [Fact]
    public async Task ColourBarShowsTheServersSequentialScale()
    {
        await using var session = await site.OpenAsync();
        var page = session.Page;
        var shown = await BarColoursAsync(page, "sequential");
        for (var k = 0; k <= 16; k++) AssertClose(ColourScale.At(k / 16.0)!.Value, shown[k], $"sequential, fraction {k}/16");
        Assert.Empty(session.Errors);
    }

    [Fact]
    public async Task DirectionLayersUseTheServersCyclicScale()
    {
        await using var session = await site.OpenAsync();
        var page = session.Page;
        await page.SelectOptionAsync("#layer-parameter", "dir");
        await page.SelectOptionAsync("#layer-statistic", "mean");
        await page.SelectOptionAsync("#layer-period", "annual");
        await ShownLayer.WaitForAsync(page, "dir", "mean", "annual");
        var shown = await BarColoursAsync(page, "direction");
        for (var k = 0; k <= 16; k++) AssertClose(DirectionColourScale.At(k / 16.0)!.Value, shown[k], $"direction, fraction {k}/16");
        // North at both ends of the bar: the same colour.
        AssertClose(shown[0], shown[16], "the two ends of the direction bar");
        Assert.Empty(session.Errors);
    }

    /// <summary>The colours of the bar at its 17 gradient stops, from a screenshot of the bar (1 px border, then the gradient).</summary>
    private async Task<(byte R, byte G, byte B)[]> BarColoursAsync(IPage page, string name)
    {
        // The legend is drawn again when the layer's last answers arrive: the bar is taken once the page has no request
        // in flight, and again should it still be replaced while it is taken.
        await page.WaitForLoadStateAsync(LoadState.NetworkIdle);
        var bar = page.Locator(".legend-bar");
        byte[] png;
        for (var attempt = 1; ; attempt++)
        {
            try
            {
                png = await bar.ScreenshotAsync(new LocatorScreenshotOptions { Path = Path.Combine(site.ScreenshotFolder, $"colour-bar-{name}.png") });
                break;
            }
            catch (PlaywrightException e) when (attempt < 5 && e.Message.Contains("not attached", StringComparison.Ordinal))
            {
                await page.WaitForTimeoutAsync(200);
            }
        }
        using var image = SKBitmap.Decode(png);
        var inner = image.Width - 2;
        var row = image.Height / 2;
        return Enumerable.Range(0, 17).Select(k =>
        {
            var x = Math.Clamp((int)Math.Floor(1 + k / 16.0 * inner), 1, inner);
            var c = image.GetPixel(x, row);
            return (c.Red, c.Green, c.Blue);
        }).ToArray();
    }

    /// <summary>Within 4 of 255 per channel: the browser interpolates the gradient between stops, so the pixel nearest a stop may lie a fraction of a pixel off it.</summary>
    private static void AssertClose((byte R, byte G, byte B) expected, (byte R, byte G, byte B) actual, string what) =>
        Assert.True(Math.Abs(expected.R - actual.R) <= 4 && Math.Abs(expected.G - actual.G) <= 4 && Math.Abs(expected.B - actual.B) <= 4,
            $"{what}: expected {expected}, the page shows {actual}");
}
