using System.Globalization;
using System.Net;
using System.Text.Json;
using Atlas.Api.Tests.Support;
using Atlas.Assessment.Access;
using Atlas.Assessment.Extremes;
using Atlas.TestSupport;

namespace Atlas.Api.Tests.Assessment;

[Collection(AtlasApiCollection.Name)]
public sealed class WindowsAndExtremesApiTests(AtlasApiFixture atlas)
{
    private readonly HttpClient _client = atlas.Factory.CreateClient();

    private static string Coast(string part, int i, int j) =>
        $"/api/v1/datasets/{SyntheticAtlas.CoastSlug}/point/{part}?{AssessmentAtlas.At(SyntheticAtlas.Latitude(j), SyntheticAtlas.Longitude(i))}";

    private static string Long(int i, int j) =>
        $"/api/v1/datasets/{AssessmentAtlas.LongSlug}/point/extremes?{AssessmentAtlas.At(AssessmentAtlas.LongSouth + AssessmentAtlas.LongStep * j, AssessmentAtlas.LongWest + AssessmentAtlas.LongStep * i)}";

    private static void Same(double expected, JsonElement actual)
    {
        if (double.IsNaN(expected)) Assert.Equal(JsonValueKind.Null, actual.ValueKind);
        else Assert.Equal(expected, actual.GetDouble(), Math.Abs(expected) * 1e-12);
    }

    [Theory]
    [InlineData(5, 4, 1.5, null, 12.0)]
    [InlineData(3, 4, 2.0, 9.0, 24.0)]   // missing steps, and a Tp limit
    public async Task WindowsEndpointReturnsWhatTheLibraryComputes(int i, int j, double hsMax, double? tpMax, double hours)
    {
        var query = string.Create(CultureInfo.InvariantCulture, $"{Coast("windows", i, j)}&hs_max={hsMax}&hours={hours}{(tpMax is { } t ? $"&tp_max={t}" : "")}");
        var root = await AssessmentAtlas.JsonAsync(await _client.GetAsync(query));
        // The library (Atlas.Assessment WeatherWindowAnalysis) on the decoded series: equal to 1e-12 relative.
        var (times, hs, _, tp, _) = AssessmentAtlas.CoastSeries(i, j);
        var limits = new AccessLimits(hsMax, tpMax);
        var expected = WeatherWindowAnalysis.Analyse(AssessmentAtlas.Regular(times, hs), tpMax is null ? null : AssessmentAtlas.Regular(times, tp), limits, hours);
        Assert.Equal(expected.RequiredSteps, root.GetProperty("required_steps").GetInt32());
        Assert.Equal(3.0, root.GetProperty("step_hours").GetDouble());
        var months = root.GetProperty("months").EnumerateArray().ToArray();
        Assert.Equal(12, months.Length);
        for (var m = 0; m < 12; m++)
        {
            var e = expected.Months[m];
            Same(e.WindowStartProbability, months[m].GetProperty("window_start_probability"));
            Same(e.MeanWindowsPerMonth, months[m].GetProperty("mean_windows_per_month"));
            Same(e.MeanWaitingHours, months[m].GetProperty("mean_waiting_hours"));
            Assert.Equal(e.WindowCount, months[m].GetProperty("window_count").GetInt32());
            Same(e.Accessibility.Fraction, months[m].GetProperty("accessible_fraction"));
        }
        Assert.Equal(expected.CalmSpells.Count, root.GetProperty("calm_spells").GetProperty("count").GetInt32());
        Same(expected.StormSpells.MeanHours, root.GetProperty("storm_spells").GetProperty("mean_hours"));
        Assert.Equal(expected.CalmSpells.CensoredCount, root.GetProperty("calm_spells").GetProperty("censored_count").GetInt32());
        Same(expected.Accessibility.Fraction, root.GetProperty("accessible_fraction"));
        Assert.Equal(Atlas.Api.Model.AtlasCaution.Text, root.GetProperty("caution").GetString());
    }

    [Fact]
    public async Task BadWindowRequestsNameTheField()
    {
        var point = Coast("windows", 5, 4);
        var missing = await Problems.AssertAsync(await _client.GetAsync($"{point}&hours=12"), HttpStatusCode.BadRequest);
        Assert.Contains("hs_max is required", missing.GetProperty("errors").GetProperty("hs_max")[0].GetString());
        await Problems.AssertAsync(await _client.GetAsync($"{point}&hs_max=1.5&hours=0"), HttpStatusCode.BadRequest, "must be above 0");
        await Problems.AssertAsync(await _client.GetAsync($"{point}&hs_max=1.5&hours=12&tp_max=long"), HttpStatusCode.BadRequest, "'long' is not a number");
        await Problems.AssertAsync(await _client.GetAsync($"{point}&hs_max=-1&hours=12"), HttpStatusCode.BadRequest, "hs_max -1 must be above 0");
    }

    [Fact]
    public async Task ExtremesEndpointReturnsTheLibraryFitsWithTheStrongCaution()
    {
        await AssessmentAtlas.EnsureSeededAsync(atlas);
        var root = await AssessmentAtlas.JsonAsync(await _client.GetAsync(Long(1, 1)));
        var (times, hs) = AssessmentAtlas.LongSeries(1, 1);
        var series = AssessmentAtlas.Regular(times, hs);
        // The library on the decoded seven-year series: annual maxima (Gumbel, GEV) and peaks over threshold (GPD).
        var annual = AnnualMaximaAnalysis.Run(series);
        var peaks = PeaksOverThresholdAnalysis.Run(series);
        var am = root.GetProperty("annual_maxima");
        Assert.True(am.GetProperty("available").GetBoolean());
        Assert.Equal(AssessmentAtlas.LongYears, am.GetProperty("maxima").EnumerateArray().Select(m => m.GetProperty("year").GetInt32()).ToArray());
        foreach (var (fit, levels) in new[] { ("gumbel", annual.GumbelReturnLevels), ("gev", annual.GevReturnLevels) })
        {
            var served = am.GetProperty(fit).GetProperty("return_levels").EnumerateArray().ToArray();
            Assert.Equal([1.0, 5, 10, 50, 100], served.Select(r => r.GetProperty("return_period_years").GetDouble()).ToArray());
            for (var k = 0; k < levels.Count; k++)
            {
                Same(levels[k].Level, served[k].GetProperty("level"));
                Same(levels[k].Lower, served[k].GetProperty("lower"));
                Assert.Equal(levels[k].IsLongExtrapolation, served[k].GetProperty("long_extrapolation").GetBoolean());
            }
            Assert.Equal(JsonValueKind.Null, served[0].GetProperty("level").ValueKind);  // 1 year is undefined from annual maxima
            Assert.NotNull(served[0].GetProperty("note").GetString());
        }
        Same(annual.Gev.Distribution.Shape, am.GetProperty("gev").GetProperty("shape"));
        var pot = root.GetProperty("peaks_over_threshold");
        Same(peaks.Threshold, pot.GetProperty("threshold"));
        Assert.Equal(peaks.Peaks.Count, pot.GetProperty("peaks").GetArrayLength());
        var potLevels = pot.GetProperty("gpd").GetProperty("return_levels").EnumerateArray().ToArray();
        for (var k = 0; k < peaks.ReturnLevels.Count; k++) Same(peaks.ReturnLevels[k].Level, potLevels[k].GetProperty("level"));
        Assert.Equal(annual.GevDiagnostics.Count, am.GetProperty("gev").GetProperty("diagnostics").GetArrayLength());
        // Seven years of record against a 100-year level: the strong caution must be there, and the general one.
        Assert.Contains("STRONG CAUTION", root.GetProperty("strong_caution").GetString());
        Assert.Contains(am.GetProperty("cautions").EnumerateArray(), c => c.GetProperty("kind").GetString() == "general");
        Assert.Equal(7.0, root.GetProperty("record_years").GetDouble(), 0.01);
        Assert.Equal(Atlas.Api.Model.AtlasCaution.Text, root.GetProperty("caution").GetString());
    }

    [Fact]
    public async Task TheServedAnnualMaximaGiveSciPysGumbelFit()
    {
        await AssessmentAtlas.EnsureSeededAsync(atlas);
        var am = (await AssessmentAtlas.JsonAsync(await _client.GetAsync($"{Long(2, 0)}&method=annual-maxima"))).GetProperty("annual_maxima");
        var maxima = am.GetProperty("maxima").EnumerateArray().Select(m => m.GetProperty("value").GetDouble().ToString("R", CultureInfo.InvariantCulture));
        // scipy.stats.gumbel_r.fit (maximum likelihood) on the same maxima; SciPy's optimiser stops at about 1e-4 relative.
        var scipy = ExternalTool.Run(ExternalTool.Python,
            ["-c", "import sys; from scipy.stats import gumbel_r; x=[float(v) for v in sys.argv[1:]]; print('%r %r' % gumbel_r.fit(x))", .. maxima])
            .Split(' ').Select(v => double.Parse(v, CultureInfo.InvariantCulture)).ToArray();
        var gumbel = am.GetProperty("gumbel");
        Assert.Equal(scipy[0], gumbel.GetProperty("location").GetDouble(), Math.Abs(scipy[0]) * 1e-3);
        Assert.Equal(scipy[1], gumbel.GetProperty("scale").GetDouble(), scipy[1] * 1e-3);
        // The 50-year level of that fit: mu - sigma ln(-ln(1 - 1/50)) (Coles 2001, eq. 3.4 with xi = 0).
        var level50 = scipy[0] - scipy[1] * Math.Log(-Math.Log(1 - 1.0 / 50));
        Assert.Equal(level50, gumbel.GetProperty("return_levels")[3].GetProperty("level").GetDouble(), level50 * 1e-3);
    }

    [Fact]
    public async Task AShortRecordHasNoAnnualMaximaFitAndSaysWhy()
    {
        var both = await AssessmentAtlas.JsonAsync(await _client.GetAsync(Coast("extremes", 5, 4)));
        Assert.False(both.GetProperty("annual_maxima").GetProperty("available").GetBoolean());
        Assert.Contains("Only 2 calendar year(s)", both.GetProperty("annual_maxima").GetProperty("reason").GetString());
        Assert.True(both.GetProperty("peaks_over_threshold").GetProperty("available").GetBoolean());
        Assert.Contains("STRONG CAUTION", both.GetProperty("strong_caution").GetString());
        await Problems.AssertAsync(await _client.GetAsync($"{Coast("extremes", 5, 4)}&method=annual-maxima"), HttpStatusCode.UnprocessableEntity, "peaks over threshold");
        await Problems.AssertAsync(await _client.GetAsync($"{Coast("extremes", 5, 4)}&method=peaks-over-threshold&threshold=50"), HttpStatusCode.UnprocessableEntity, "Lower the threshold");
    }

    [Fact]
    public async Task BadExtremesRequestsNameTheField()
    {
        var point = Coast("extremes", 5, 4);
        await Problems.AssertAsync(await _client.GetAsync($"{point}&method=block-maxima"), HttpStatusCode.BadRequest, "annual-maxima or peaks-over-threshold");
        await Problems.AssertAsync(await _client.GetAsync($"{point}&threshold_quantile=1.5"), HttpStatusCode.BadRequest, "must be below 1");
        await Problems.AssertAsync(await _client.GetAsync($"{point}&separation_hours=-3"), HttpStatusCode.BadRequest, "at or above 0");
        await Problems.AssertAsync(await _client.GetAsync($"/api/v1/datasets/{SyntheticAtlas.CoastSlug}/point/extremes?lat=40.4"), HttpStatusCode.BadRequest, "lon is required");
    }
}
