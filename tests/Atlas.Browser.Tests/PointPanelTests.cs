using System.Globalization;
using System.Text;
using System.Text.Json;
using Microsoft.Playwright;

namespace Atlas.Browser.Tests;

[Collection(AtlasSiteCollection.Name)]
public class PointPanelTests(AtlasSite site)
{
    private static string F(double v) => v.ToString("0.#####", CultureInfo.InvariantCulture);

    [Fact]
    public async Task ClickingASeaCellShowsTheApisNumbers()
    {
        await using var session = await site.OpenAsync();
        var page = session.Page;
        var cell = await SeaCells.OffshoreAsync(site.Http);
        await PageMap.ClickAsync(page, cell.Lat, cell.Lon);
        await page.WaitForSelectorAsync("#point-stats");

        // The panel asked for the clicked position; the API's answer for that same URL is the reference.
        var jsonHref = (await page.GetAttributeAsync("a[data-link='point-json']", "href"))!;
        Assert.StartsWith($"/api/v1/datasets/{AtlasSite.Slug}/point?lat=", jsonHref);
        var api = await PageMap.GetJsonAsync(site.Http, jsonHref);
        var apiCell = api.GetProperty("cell");
        Assert.Equal(cell.Id, apiCell.GetProperty("id").GetInt32());
        Assert.Contains($"{cell.Id} at", await page.TextContentAsync("[data-field='cell-id']"));
        ShownNumber.Matches(apiCell.GetProperty("depth_m").GetDouble(), (await page.TextContentAsync("[data-field='depth']"))!, "depth");
        ShownNumber.Matches(apiCell.GetProperty("distance_m").GetDouble() / 1000, (await page.TextContentAsync("[data-field='distance']"))!, "distance");
        ShownNumber.Matches(apiCell.GetProperty("coast_distance_m").GetDouble() / 1000, (await page.TextContentAsync("[data-field='coast-distance']"))!, "coast distance");

        var annual = api.GetProperty("periods").EnumerateArray().Single(p => p.GetProperty("period").GetString() == "annual");
        ShownNumber.Matches(annual.GetProperty("j").GetProperty("mean").GetDouble(), (await page.TextContentAsync("[data-field='annual-power']"))!, "annual power");
        foreach (var parameter in new[] { "hs", "te", "tp", "j", "spread" })
            foreach (var statistic in new[] { "mean", "p10", "p50", "p90", "p99", "max" })
            {
                var shown = await page.TextContentAsync($"#point-stats tr[data-parameter='{parameter}'] td[data-statistic='{statistic}']");
                ShownNumber.Matches(annual.GetProperty(parameter).GetProperty(statistic).GetDouble(), shown!, $"{parameter} {statistic}");
            }
        ShownNumber.Matches(annual.GetProperty("direction").GetProperty("mean").GetDouble(),
            (await page.TextContentAsync("#point-stats tr[data-parameter='dir'] td[data-statistic='mean']"))!, "direction");
        ShownNumber.Matches(annual.GetProperty("direction").GetProperty("directionality_coefficient").GetDouble(),
            (await page.TextContentAsync("#point-stats tr[data-parameter='d'] td[data-statistic='mean']"))!, "directionality coefficient");

        // The other periods of the same answer, through the period selector.
        await page.SelectOptionAsync("#point-period", "djf");
        var winter = api.GetProperty("periods").EnumerateArray().Single(p => p.GetProperty("period").GetString() == "djf");
        ShownNumber.Matches(winter.GetProperty("hs").GetProperty("p90").GetDouble(),
            (await page.TextContentAsync("#point-stats tr[data-parameter='hs'] td[data-statistic='p90']"))!, "winter hs p90");

        // Charts, the joint table, the rose and the year-to-year table are all there.
        Assert.True(await page.Locator(".point-panel .uplot").CountAsync() >= 3, "monthly, exceedance and inter-annual charts");
        var joint = api.GetProperty("joint_occurrence");
        var nonEmptyBins = joint.GetProperty("counts").EnumerateArray().SelectMany(r => r.EnumerateArray()).Count(c => c.GetInt64() > 0);
        Assert.Equal(nonEmptyBins, await page.Locator(".joint-table td[title]").CountAsync());
        var sectors = api.GetProperty("power_rose").GetProperty("fractions").EnumerateArray().Count(f => f.GetDouble() > 0);
        Assert.Equal(sectors, await page.Locator(".power-rose:not(#spectral-rose .power-rose) path").CountAsync());
        Assert.Equal(api.GetProperty("inter_annual").GetArrayLength(),
            await page.Locator(".point-panel table.stats-table:has(caption:text('Coefficient of variation')) tbody tr").CountAsync());

        // The CSV link gives the same statistics as text.
        var csvHref = (await page.GetAttributeAsync("a[data-link='point-csv']", "href"))!;
        using var csv = await site.Http.GetAsync(csvHref);
        Assert.Equal("text/csv", csv.Content.Headers.ContentType?.MediaType);
        var csvText = await csv.Content.ReadAsStringAsync();
        var annualJ = csvText.Split('\n').Single(l => l.StartsWith("annual,j,", StringComparison.Ordinal)).Split(',');
        Assert.Equal(annual.GetProperty("j").GetProperty("mean").GetDouble(), double.Parse(annualJ[2], CultureInfo.InvariantCulture), 9);

        // The report link gives the site report of the same position as a PDF (its contents are read back by the API's tests).
        Assert.Equal("Report (PDF)", await page.TextContentAsync("a[data-link='site-report']"));
        var reportHref = (await page.GetAttributeAsync("a[data-link='site-report']", "href"))!;
        using var report = await site.Http.GetAsync(reportHref);
        Assert.Equal("application/pdf", report.Content.Headers.ContentType?.MediaType);
        Assert.StartsWith("%PDF-", Encoding.ASCII.GetString(await report.Content.ReadAsByteArrayAsync(), 0, 5));

        Assert.Empty(session.Errors);
        await page.ScreenshotAsync(new PageScreenshotOptions { Path = Path.Combine(site.ScreenshotFolder, "wide-point.png") });
        await page.ScreenshotAsync(new PageScreenshotOptions { Path = Path.Combine(site.ScreenshotFolder, "wide-point-panel.png"), FullPage = false });
        await page.Locator("#point-panel").ScreenshotAsync(new LocatorScreenshotOptions { Path = Path.Combine(site.ScreenshotFolder, "point-panel-full.png") });
    }

    [Fact]
    public async Task EnterOnTheFocusedMapReadsTheMapCentreAndEscapeCloses()
    {
        await using var session = await site.OpenAsync();
        var page = session.Page;
        var cell = await SeaCells.OffshoreAsync(site.Http);
        await page.EvaluateAsync("([lat, lon]) => window.atlasPage.map.setView([lat, lon], window.atlasPage.map.getZoom(), { animate: false })",
            new[] { cell.Lat, cell.Lon });
        await page.FocusAsync("#map");
        await page.Keyboard.PressAsync("Enter");
        await page.WaitForSelectorAsync("#point-stats");
        Assert.Contains($"{cell.Id} at", await page.TextContentAsync("[data-field='cell-id']"));
        await page.FocusAsync("#point-close");
        await page.Keyboard.PressAsync("Escape");
        Assert.True(await page.Locator("#point-panel").IsHiddenAsync());
        Assert.Empty(session.Errors);
    }

    [Fact]
    public async Task TypedPositionOpensTheSameCellAsAClick()
    {
        await using var session = await site.OpenAsync();
        var page = session.Page;
        var cell = await SeaCells.OffshoreAsync(site.Http);
        await page.FillAsync("#read-form input[name='lat']", F(cell.Lat));
        await page.FillAsync("#read-form input[name='lon']", F(cell.Lon));
        await page.PressAsync("#read-form input[name='lon']", "Enter");
        await page.WaitForSelectorAsync("#point-stats");
        Assert.Contains($"{cell.Id} at", await page.TextContentAsync("[data-field='cell-id']"));
    }

    [Fact]
    public async Task ClickingLandSaysWhyThereAreNoStatistics()
    {
        await using var session = await site.OpenAsync();
        var page = session.Page;
        var land = await PageMap.GetJsonAsync(site.Http, $"/api/v1/datasets/{AtlasSite.Slug}/land");
        var (lat, lon) = LandPoint.Inside(land);
        await page.EvaluateAsync("([lat, lon]) => window.atlasPage.map.setView([lat, lon], window.atlasPage.map.getZoom(), { animate: false })",
            new[] { lat, lon });
        // The canvas shows land there.
        await ShownLayer.WaitForLandAsync(page);
        await PageMap.NextFrameAsync(page);
        var rgba = await PageMap.CanvasColourAtAsync(page, lat, lon);
        Assert.Equal(255, rgba[3]);
        await PageMap.ClickAsync(page, lat, lon);
        await page.WaitForSelectorAsync("#point-body .error-box, #point-stats");
        // A click on land far from any wet cell is refused by the API (422); one close to the shore reads the nearest
        // wet cell. Either way the page says what it shows.
        var refused = await page.Locator("#point-body .error-box").CountAsync() > 0;
        if (refused) Assert.Contains("No statistics here", await page.TextContentAsync("#point-body .error-box"));
    }
}
