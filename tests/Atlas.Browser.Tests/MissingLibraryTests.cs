using Atlas.TestSupport;
using Microsoft.Playwright;

namespace Atlas.Browser.Tests;

/// <summary>A server whose page libraries were never installed (npm ci not run): the page says so and how to mend it.</summary>
[Collection(AtlasSiteCollection.Name)]
public class MissingLibraryTests(AtlasSite site)
{
    [Theory]
    [InlineData("**/node_modules/leaflet/**", "Leaflet")]
    [InlineData("**/node_modules/uplot/**", "uPlot")]
    public async Task PageSaysWhichLibraryIsMissingAndHowToInstallIt(string blocked, string library)
    {
        await using var context = await site.Browser.NewContextAsync(new BrowserNewContextOptions
        {
            ViewportSize = new ViewportSize { Width = 1280, Height = 800 },
            BaseURL = site.BaseUrl,
        });
        context.SetDefaultTimeout(Patience.LimitMilliseconds);
        var page = await context.NewPageAsync();
        // As on a server where wwwroot/node_modules is missing: the library's files answer 404.
        await page.RouteAsync(blocked, route => route.FulfillAsync(new RouteFulfillOptions { Status = 404, Body = "not found" }));
        await page.GotoAsync("/");
        var status = page.Locator("#map-status.error");
        await Assertions.Expect(status).ToContainTextAsync("did not load");
        var text = (await status.TextContentAsync())!;
        Assert.Contains(library, text);
        Assert.Contains("deploy/prepare.sh", text);
        Assert.Contains("npm ci", text);
        Assert.DoesNotContain("Loading", (await page.TextContentAsync("#dataset-title"))!);
        // No empty colour-bar frame beside the message.
        await Assertions.Expect(page.Locator("#map-legend")).ToBeHiddenAsync();
        await page.ScreenshotAsync(new PageScreenshotOptions { Path = Path.Combine(site.ScreenshotFolder, $"missing-{library.ToLowerInvariant()}.png") });
    }
}
