using System.Text.Json;
using Microsoft.Playwright;

namespace Atlas.Browser.Tests;

/// <summary>
/// The demo's output points as a user meets them: markers on the map of the gridded dataset, and a click on one shows
/// the values integrated from its spectra, the numbers equal to the API's answer for the same URL.
/// </summary>
[Collection(AtlasSiteCollection.Name)]
public class OutputPointTests(AtlasSite site)
{
    [Fact]
    public async Task AMarkerOpensTheSpectralValuesOfItsOutputPoint()
    {
        await using var session = await site.OpenAsync();
        var page = session.Page;
        var detail = await PageMap.GetJsonAsync(site.Http, $"/api/v1/datasets/{AtlasSite.Slug}");
        var points = detail.GetProperty("output_points").EnumerateArray().ToList();
        Assert.Equal(3, points.Count);
        await Assertions.Expect(page.Locator("path.output-point")).ToHaveCountAsync(3);

        var lease = points.Single(p => p.GetProperty("name").GetString() == "Tollan Lease Inshore Edge");
        await page.EvaluateAsync("([lat, lon]) => window.atlasPage.map.setView([lat, lon], window.atlasPage.map.getZoom(), { animate: false })",
            new[] { lease.GetProperty("lat").GetDouble(), lease.GetProperty("lon").GetDouble() });
        // The marker of the lease edge: the one whose tooltip names it.
        var markers = page.Locator("path.output-point");
        var leaseTip = page.Locator(".leaflet-tooltip", new() { HasText = "Tollan Lease Inshore Edge" });
        ILocator? marker = null;
        for (int k = 0; k < 3 && marker is null; k++)
        {
            await markers.Nth(k).HoverAsync();
            if (await leaseTip.CountAsync() > 0 && await leaseTip.First.IsVisibleAsync()) marker = markers.Nth(k);
            else await page.Mouse.MoveAsync(0, 0);
        }
        Assert.NotNull(marker);
        await marker!.ClickAsync();
        await Assertions.Expect(page.Locator("[data-field='spectral-where']")).ToContainTextAsync("nearest output point, Tollan Lease Inshore Edge, 0");

        var jsonHref = (await page.GetAttributeAsync("a[data-link='point-json']", "href"))!;
        var api = await PageMap.GetJsonAsync(site.Http, jsonHref);
        var annual = api.GetProperty("spectral").GetProperty("periods").EnumerateArray().Single(p => p.GetProperty("period").GetString() == "annual");
        foreach (var (field, member) in new[] { ("spectral-power", "mean_power_spectral"), ("parametric-power", "mean_power_parametric"),
                     ("spectral-d", "directionality_coefficient"), ("spectral-width", "mean_spectral_width") })
            ShownNumber.Matches(annual.GetProperty(member).GetDouble(), (await page.TextContentAsync($"#spectral-stats [data-field='{field}']"))!, member);
        await Assertions.Expect(page.Locator("#spectral-stats")).ToBeVisibleAsync();
        Assert.Empty(session.Errors);
    }
}
