using System.Globalization;
using System.Net;
using System.Text;
using System.Text.Json;
using System.Text.RegularExpressions;
using Atlas.Api.Tests.Support;
using Atlas.TestSupport;

namespace Atlas.Api.Tests.Reports;

/// <summary>
/// The area report read back by poppler-utils (Debian's pdfinfo, pdftotext, pdftoppm): the caution and page number on
/// every page, its statistics and shares above thresholds equal to <c>POST /area</c> for the same body and layer, and
/// its screening count equal to the cells of <c>GET /screen</c> inside the polygon; compared at the printed precision.
/// </summary>
[Collection(AtlasApiCollection.Name)]
public sealed class AreaReportTests(AtlasApiFixture atlas)
{
    private readonly HttpClient _client = atlas.Factory.CreateClient();
    private static readonly string Coast = $"/api/v1/datasets/{SyntheticAtlas.CoastSlug}";

    // An invented rectangle over the middle of the test grid (lon, lat), closed.
    private const double West = 20.12, South = 40.13, East = 20.71, North = 40.77;
    private static readonly string Rectangle = string.Create(CultureInfo.InvariantCulture,
        $$"""{"type":"Polygon","coordinates":[[[{{West}},{{South}}],[{{East}},{{South}}],[{{East}},{{North}}],[{{West}},{{North}}],[{{West}},{{South}}]]]}""");

    private static StringContent Json(string body) => new(body, Encoding.UTF8, "application/geo+json");

    [Fact]
    public async Task AreaReportNumbersEqualTheAreaAndScreeningAnswers()
    {
        var response = await _client.PostAsync($"{Coast}/area/report.pdf?parameter=j&statistic=mean&period=annual&min_power_kw_m=12&max_depth_m=100", Json(Rectangle));
        Assert.True(response.StatusCode == HttpStatusCode.OK, await response.Content.ReadAsStringAsync());
        Assert.Equal("application/pdf", response.Content.Headers.ContentType?.MediaType);
        var report = new PopplerReport(await response.Content.ReadAsByteArrayAsync(), "area-report");
        var caution = PopplerReport.Flatten(Atlas.Api.Model.AtlasCaution.Text);
        for (var page = 1; page <= report.Pages; page++)
        {
            var text = PopplerReport.Flatten(report.Page(page, layout: false));
            Assert.Contains(caution, text);
            Assert.Contains($"Page {page} of {report.Pages}", text);
        }
        Assert.Equal(report.Pages, report.Render().Count);

        var area = await AssessmentJson($"{Coast}/area?parameter=j&statistic=mean&period=annual");
        var flat = report.Flat();
        PrintedNumber.Equal(area.GetProperty("area_km2").GetDouble(), Match(flat, @"area of the polygon ([\d.]+) km²"), 2);
        PrintedNumber.Equal(area.GetProperty("mean").GetDouble(), Match(flat, @"mean over the cells ([\d.]+) kW/m"), 1);
        PrintedNumber.Equal(area.GetProperty("area_weighted_mean").GetDouble(), Match(flat, @"area-weighted mean ([\d.]+) kW/m"), 1);
        Assert.Equal(area.GetProperty("cell_count").GetInt32().ToString(CultureInfo.InvariantCulture), Match(flat, @"wet cells inside \(with a value\) (\d+)"));

        // Each threshold row (above, cells, area km², share) against POST /area with that threshold.
        var rows = Regex.Matches(report.Page(1), @"^\s*([\d.]+) kW/m\s+(\d+)\s+([\d.]+)\s+([\d.]+) %", RegexOptions.Multiline);
        Assert.True(rows.Count >= 3, report.Page(1));
        foreach (Match row in rows)
        {
            var level = row.Groups[1].Value;
            var above = await AssessmentJson($"{Coast}/area?parameter=j&statistic=mean&period=annual&threshold={level}");
            Assert.Equal(above.GetProperty("cells_above_threshold").GetInt32().ToString(CultureInfo.InvariantCulture), row.Groups[2].Value);
            PrintedNumber.Equal(above.GetProperty("area_above_threshold_km2").GetDouble(), row.Groups[3].Value, 2);
            PrintedNumber.Equal(100 * above.GetProperty("area_above_threshold_km2").GetDouble() / above.GetProperty("cell_area_km2").GetDouble(), row.Groups[4].Value, 1);
        }

        // Screening: the cells GET /screen gives for the same criteria whose centres lie inside the rectangle.
        var screened = JsonDocument.Parse(await _client.GetStringAsync($"{Coast}/screen?min_power_kw_m=12&max_depth_m=100&period=annual")).RootElement;
        var inside = screened.GetProperty("features").EnumerateArray().Count(f =>
        {
            var c = f.GetProperty("geometry").GetProperty("coordinates");
            var (lon, lat) = (c[0].GetDouble(), c[1].GetDouble());
            return lon > West && lon < East && lat > South && lat < North;
        });
        Assert.Equal(inside.ToString(CultureInfo.InvariantCulture), Match(flat, @"(\d+) of the \d+ wet cells inside meet them"));
        Assert.Contains(SyntheticAtlas.SourceChecksum, flat);
    }

    [Fact]
    public async Task AnAreaWithNoWetCellIsAProblemAnswer()
    {
        // Over the two dry columns only (lon 21.0 and 21.1).
        var land = """{"type":"Polygon","coordinates":[[[20.95,40.2],[21.15,40.2],[21.15,40.6],[20.95,40.6],[20.95,40.2]]]}""";
        await Problems.AssertAsync(await _client.PostAsync($"{Coast}/area/report.pdf", Json(land)), HttpStatusCode.UnprocessableEntity, "No wet cell");
    }

    [Fact]
    public async Task ASelfIntersectingRingAndBadQueryValuesAreProblemAnswers()
    {
        var bowtie = """{"type":"Polygon","coordinates":[[[20.1,40.1],[20.6,40.6],[20.6,40.1],[20.1,40.6],[20.1,40.1]]]}""";
        await Problems.AssertAsync(await _client.PostAsync($"{Coast}/area/report.pdf", Json(bowtie)), HttpStatusCode.UnprocessableEntity);
        var bad = await Problems.AssertAsync(await _client.PostAsync($"{Coast}/area/report.pdf?parameter=nope&min_depth_m=-3", Json(Rectangle)), HttpStatusCode.BadRequest);
        Assert.True(bad.GetProperty("errors").TryGetProperty("parameter", out _));
        Assert.True(bad.GetProperty("errors").TryGetProperty("min_depth_m", out _));
    }

    private async Task<JsonElement> AssessmentJson(string url)
    {
        var response = await _client.PostAsync(url, Json(Rectangle));
        var body = await response.Content.ReadAsStringAsync();
        Assert.True(response.StatusCode == HttpStatusCode.OK, body);
        return JsonDocument.Parse(body).RootElement.Clone();
    }

    private static string Match(string text, string pattern)
    {
        var match = Regex.Match(text, pattern);
        Assert.True(match.Success, $"'{pattern}' not in the report");
        return match.Groups[1].Value;
    }
}
