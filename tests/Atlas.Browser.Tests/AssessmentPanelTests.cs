using System.Text.Json;

namespace Atlas.Browser.Tests;

[Collection(AtlasSiteCollection.Name)]
public class AssessmentPanelTests(AtlasSite site)
{
    // Haversine on a sphere of 6371.0088 km (IUGG mean radius): only used to pick the nearest buoy, as the page does.
    private static double DistanceKm(double lat1, double lon1, double lat2, double lon2)
    {
        const double r = Math.PI / 180;
        var a = Math.Pow(Math.Sin((lat2 - lat1) * r / 2), 2) + Math.Cos(lat1 * r) * Math.Cos(lat2 * r) * Math.Pow(Math.Sin((lon2 - lon1) * r / 2), 2);
        return 2 * 6371.0088 * Math.Asin(Math.Min(1, Math.Sqrt(a)));
    }

    [Fact]
    public async Task PointPanelShowsTheNearestBuoysSkillAndTheDeviceYieldOfTheApi()
    {
        await using var session = await site.OpenAsync();
        var page = session.Page;
        var cell = await SeaCells.OffshoreAsync(site.Http);
        await PageMap.ClickAsync(page, cell.Lat, cell.Lon);
        await page.WaitForSelectorAsync("#point-body[data-assessments='done']");
        var at = $"lat={cell.Lat:0.#####}&lon={cell.Lon:0.#####}";

        var stations = (await PageMap.GetJsonAsync(site.Http, "/api/v1/stations")).GetProperty("stations").EnumerateArray().ToArray();
        Assert.NotEmpty(stations);
        var nearest = stations.MinBy(s => DistanceKm(cell.Lat, cell.Lon, s.GetProperty("lat").GetDouble(), s.GetProperty("lon").GetDouble()));
        var validation = await PageMap.GetJsonAsync(site.Http,
            $"/api/v1/datasets/{AtlasSite.Slug}/validation?station={nearest.GetProperty("slug").GetString()}");
        var skill = validation.GetProperty("stations")[0];
        Assert.Contains(skill.GetProperty("station").GetProperty("name").GetString()!, await page.TextContentAsync("[data-field='station']"));
        var hs = skill.GetProperty("variables").EnumerateArray().Single(v => v.GetProperty("variable").GetString() == "hs").GetProperty("overall");
        var row = page.Locator("#validation-table tr[data-variable='hs'] td");
        Assert.Equal(hs.GetProperty("n").GetInt32().ToString(), await row.Nth(0).TextContentAsync());
        ShownNumber.Matches(hs.GetProperty("bias").GetDouble(), (await row.Nth(1).TextContentAsync())!, "Hs bias");
        ShownNumber.Matches(hs.GetProperty("rmse").GetDouble(), (await row.Nth(2).TextContentAsync())!, "Hs RMSE");
        ShownNumber.Matches(hs.GetProperty("scatter_index").GetDouble(), (await row.Nth(3).TextContentAsync())!, "Hs scatter index");

        // Skill by season and by class of the measured Hs, as the validation answer gives it.
        var hsVariable = skill.GetProperty("variables").EnumerateArray().Single(v => v.GetProperty("variable").GetString() == "hs");
        // Groups without pairs (the browser's reduced demo covers a few months) are left out of the table.
        static bool HasPairs(JsonElement g) => g.GetProperty("skill").ValueKind == JsonValueKind.Object && g.GetProperty("skill").GetProperty("n").GetInt32() > 0;
        foreach (var group in hsVariable.GetProperty("by_season").EnumerateArray().Where(HasPairs))
        {
            var cells = page.Locator($"#validation-groups-hs tr[data-group='{group.GetProperty("season").GetString()}'] td");
            Assert.Equal(group.GetProperty("skill").GetProperty("n").GetInt32().ToString(), await cells.Nth(0).TextContentAsync());
            ShownNumber.Matches(group.GetProperty("skill").GetProperty("bias").GetDouble(), (await cells.Nth(1).TextContentAsync())!, "seasonal Hs bias");
        }
        Assert.Equal(hsVariable.GetProperty("by_hs_class").EnumerateArray().Count(HasPairs),
            await page.Locator("#validation-groups-hs tr[data-group^='hs-']").CountAsync());
        // The time series with the buoy over it, the scatter of model against measurement and the QQ plot are drawn.
        Assert.Equal(1, await page.Locator("figure[data-chart='time-series'] canvas").CountAsync());
        Assert.Contains("measured Hs", await page.TextContentAsync("figure[data-chart='time-series']"));
        Assert.Equal(1, await page.Locator("figure[data-chart='validation-scatter'] canvas").CountAsync());
        Assert.Equal(1, await page.Locator("figure[data-chart='validation-qq'] canvas").CountAsync());
        ShownNumber.Matches(hs.GetProperty("regression_slope").GetDouble(),
            System.Text.RegularExpressions.Regex.Match((await page.TextContentAsync("figure[data-chart='validation-scatter']"))!, @"fitted: ([\d.]+) x").Groups[1].Value, "fitted slope");

        var device = (await PageMap.GetJsonAsync(site.Http, "/api/v1/devices")).GetProperty("devices")[0].GetProperty("slug").GetString();
        var yield = await PageMap.GetJsonAsync(site.Http, $"/api/v1/datasets/{AtlasSite.Slug}/point/yield?{at}&device={device}");
        ShownNumber.Matches(yield.GetProperty("annual_energy_mwh").GetDouble(), (await page.TextContentAsync("[data-field='annual-energy']"))!, "annual energy");
        ShownNumber.Matches(100 * yield.GetProperty("capacity_factor").GetDouble(), (await page.TextContentAsync("[data-field='capacity-factor']"))!, "capacity factor");

        var windows = await PageMap.GetJsonAsync(site.Http, $"/api/v1/datasets/{AtlasSite.Slug}/point/windows?{at}&hs_max=1.5&hours=12");
        Assert.Equal(windows.GetProperty("months").EnumerateArray().Count(m => m.GetProperty("steps").GetInt32() > 0),
            await page.Locator("#windows-table tbody tr").CountAsync());
        Assert.True(await page.Locator("#extremes").IsVisibleAsync());
        Assert.Empty(session.Errors);
        await page.Locator("#assessment-sections").ScreenshotAsync(new() { Path = Path.Combine(site.ScreenshotFolder, "point-assessments.png") });
    }
}
