using System.Globalization;
using System.Net;
using System.Text.Json;
using System.Text.RegularExpressions;
using Atlas.Api.Tests.Assessment;
using Atlas.Api.Tests.Support;
using Atlas.TestSupport;

namespace Atlas.Api.Tests.Reports;

/// <summary>
/// The site report read back by poppler-utils (pdfinfo, pdftotext, pdftoppm; Debian): its pages, the caution and page
/// number on each, and its numbers against the API's JSON for the same point, compared at the precision the report
/// prints (half a unit of its last decimal).
/// </summary>
[Collection(AtlasApiCollection.Name)]
public sealed partial class SiteReportTests(AtlasApiFixture atlas)
{
    private readonly HttpClient _client = atlas.Factory.CreateClient();
    private const int I = 5, J = 4;
    private static readonly string Coast = $"/api/v1/datasets/{SyntheticAtlas.CoastSlug}";
    private static string At => AssessmentAtlas.At(SyntheticAtlas.Latitude(J), SyntheticAtlas.Longitude(I));

    private async Task<PopplerReport> ReportAsync(string query, string name)
    {
        var response = await _client.GetAsync($"{Coast}/point/report.pdf?{query}");
        Assert.True(response.StatusCode == HttpStatusCode.OK, await response.Content.ReadAsStringAsync());
        Assert.Equal("application/pdf", response.Content.Headers.ContentType?.MediaType);
        return new PopplerReport(await response.Content.ReadAsByteArrayAsync(), name);
    }

    [Fact]
    public async Task EveryPageCarriesTheCautionAndItsNumberOutOfTheTotal()
    {
        var report = await ReportAsync(At, "site-report-pages");
        Assert.True(report.Pages >= 7, $"{report.Pages} pages");
        var caution = PopplerReport.Flatten(Atlas.Api.Model.AtlasCaution.Text);
        for (var page = 1; page <= report.Pages; page++)
        {
            var text = PopplerReport.Flatten(report.Page(page, layout: false));
            Assert.Contains(caution, text);
            Assert.Contains($"Page {page} of {report.Pages}", text);
        }
        var pngs = report.Render();
        Assert.Equal(report.Pages, pngs.Count);
    }

    [Fact]
    public async Task SummaryAndJointTableNumbersEqualThePointAnswer()
    {
        await YieldApiTests.EnsureDeviceAsync(atlas, "Test Absorber", YieldApiTests.AbsorberCsv());
        var point = await AssessmentAtlas.JsonAsync(await _client.GetAsync($"{Coast}/point?{At}"));
        var report = await ReportAsync(At + "&device=test-absorber", "site-report-numbers");
        var first = report.Page(1);
        var periods = point.GetProperty("periods").EnumerateArray().ToDictionary(p => p.GetProperty("period").GetString()!);

        // Columns of the summary table: Hs mean, Hs p90, Te mean, Tp mean, J mean, J p90, d, dir, max J from, coverage.
        foreach (var (label, period) in new[] { ("annual", "annual"), ("winter (DJF)", "djf"), ("summer (JJA)", "jja") })
        {
            var row = Row(first, label);
            var p = periods[period];
            PrintedNumber.Equal(p.GetProperty("hs").GetProperty("mean").GetDouble(), row[0], 2);
            PrintedNumber.Equal(p.GetProperty("hs").GetProperty("p90").GetDouble(), row[1], 2);
            PrintedNumber.Equal(p.GetProperty("te").GetProperty("mean").GetDouble(), row[2], 2);
            PrintedNumber.Equal(p.GetProperty("tp").GetProperty("mean").GetDouble(), row[3], 2);
            PrintedNumber.Equal(p.GetProperty("j").GetProperty("mean").GetDouble(), row[4], 1);
            PrintedNumber.Equal(p.GetProperty("direction").GetProperty("directionality_coefficient").GetDouble(), row[6], 2);
            PrintedNumber.Equal(p.GetProperty("direction").GetProperty("mean").GetDouble(), row[7], 0);
        }

        // The joint table's most frequent bin and its share, against the argmax of fraction_of_time.
        var joint = point.GetProperty("joint_occurrence");
        var shares = joint.GetProperty("fraction_of_time").EnumerateArray().Select(r => r.EnumerateArray().Select(v => v.GetDouble()).ToArray()).ToArray();
        var (bestRow, bestColumn) = (0, 0);
        for (var r = 0; r < shares.Length; r++)
            for (var c = 0; c < shares[r].Length; c++)
                if (shares[r][c] > shares[bestRow][bestColumn]) (bestRow, bestColumn) = (r, c);
        var flat = report.Flat();
        var most = MostFrequent().Match(flat);
        Assert.True(most.Success, "no most-frequent line in the report");
        PrintedNumber.Equal(joint.GetProperty("hs_bin_lower_edges")[bestRow].GetDouble(), most.Groups["hs"].Value, 1);
        PrintedNumber.Equal(joint.GetProperty("te_bin_lower_edges")[bestColumn].GetDouble(), most.Groups["te"].Value, 0);
        PrintedNumber.Equal(100 * shares[bestRow][bestColumn], most.Groups["share"].Value, 2);

        // The device's mean annual energy, against /point/yield for the same point.
        var yield = await AssessmentAtlas.JsonAsync(await _client.GetAsync($"{Coast}/point/yield?{At}&device=test-absorber"));
        var energy = Regex.Match(flat, @"mean annual energy (\d+) MWh/yr");
        Assert.True(energy.Success, "no annual energy in the report");
        PrintedNumber.Equal(yield.GetProperty("annual_energy_mwh").GetDouble(), energy.Groups[1].Value, 0);

        // Weather windows: the share of time within the report's default limits, against /point/windows with them.
        var windows = await AssessmentAtlas.JsonAsync(await _client.GetAsync($"{Coast}/point/windows?{At}&hs_max=2&hours=12"));
        var within = Regex.Match(flat, @"Time within the limits: ([\d.]+) %");
        Assert.True(within.Success, "no time within limits in the report");
        PrintedNumber.Equal(100 * windows.GetProperty("accessible_fraction").GetDouble(), within.Groups[1].Value, 1);

        // Provenance: the source file and its checksum in the appendix; no code identifier in the words.
        Assert.Contains(SyntheticAtlas.SourceFileName, flat);
        Assert.Contains(SyntheticAtlas.SourceChecksum, flat);
        Assert.DoesNotContain("JonswapGamma33", flat);
        Assert.DoesNotMatch(@"\b[a-z]+_[a-z]+\b", flat);
        Assert.Contains("Cite as:", flat);
    }

    [Fact]
    public async Task APositionOnLandIsAProblemAnswer()
    {
        await using var strict = atlas.Create(new Dictionary<string, string?> { ["AtlasApiOptions:PointMaxDistanceKm"] = "5" });
        // lon 21.05 lies between the two dry columns, about 12.7 km east of the last wet column.
        var response = await strict.CreateClient().GetAsync($"{Coast}/point/report.pdf?lat=40.45&lon=21.05");
        await Problems.AssertAsync(response, HttpStatusCode.UnprocessableEntity, "the limit is 5 km");
    }

    [Fact]
    public async Task AWindowWithNoStepsIsAProblemAnswer()
    {
        var response = await _client.GetAsync($"{Coast}/point/report.pdf?{At}&from=1990&to=1991");
        await Problems.AssertAsync(response, HttpStatusCode.UnprocessableEntity, "no stored series in the window 1990-1991");
    }

    [Fact]
    public async Task AnUnknownDeviceIsAProblemAnswer()
    {
        var response = await _client.GetAsync($"{Coast}/point/report.pdf?{At}&device=no-such-device");
        await Problems.AssertAsync(response, HttpStatusCode.NotFound, "no device 'no-such-device'");
    }

    [Fact]
    public async Task BadQueryValuesAreNamed()
    {
        var response = await _client.GetAsync($"{Coast}/point/report.pdf?{At}&hs_max=-1&months=13");
        var problem = await Problems.AssertAsync(response, HttpStatusCode.BadRequest);
        var errors = problem.GetProperty("errors");
        Assert.True(errors.TryGetProperty("hs_max", out _));
        Assert.True(errors.TryGetProperty("months", out _));
    }

    /// <summary>The numbers after a row's label in the layout text of a page.</summary>
    private static string[] Row(string page, string label)
    {
        var line = page.Split('\n').Select(l => l.Trim()).First(l => l.StartsWith(label + " ", StringComparison.Ordinal));
        return line[label.Length..].Split(' ', StringSplitOptions.RemoveEmptyEntries);
    }

    [GeneratedRegex(@"Most frequent sea state: Hs (?<hs>[\d.]+)–[\d.]+ m, Te (?<te>[\d.]+)–[\d.]+ s, (?<share>[\d.]+) % of the time")]
    private static partial Regex MostFrequent();
}
