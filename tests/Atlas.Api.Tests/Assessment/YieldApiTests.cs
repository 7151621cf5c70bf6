using System.Globalization;
using System.Net;
using System.Text;
using System.Text.Json;
using Atlas.Api.Tests.Support;
using Atlas.Assessment.Yield;

namespace Atlas.Api.Tests.Assessment;

[Collection(AtlasApiCollection.Name)]
public sealed class YieldApiTests(AtlasApiFixture atlas)
{
    private readonly HttpClient _client = atlas.Factory.CreateClient();

    private static string Point(int i, int j) => $"/api/v1/datasets/{SyntheticAtlas.CoastSlug}/point/yield?{AssessmentAtlas.At(SyntheticAtlas.Latitude(j), SyntheticAtlas.Longitude(i))}";

    /// <summary>An invented point absorber: Hs 0.5..6 m by Te 4..14 s, power rising as Hs^2 to a 400 kW cap, peaking at Te 8 s.</summary>
    internal static string AbsorberCsv()
    {
        var text = new StringBuilder("# invented test device\nhs_m\\te_s");
        for (var te = 4; te <= 14; te++) text.Append(',').Append(te);
        text.Append('\n');
        for (var hs = 0.5; hs <= 6.0001; hs += 0.5)
        {
            text.Append(hs.ToString("0.0", CultureInfo.InvariantCulture));
            for (var te = 4; te <= 14; te++)
                text.Append(',').Append(Math.Min(400, Math.Round(60 * hs * hs * Math.Exp(-Math.Pow((te - 8) / 3.0, 2)))).ToString(CultureInfo.InvariantCulture));
            text.Append('\n');
        }
        return text.ToString();
    }

    internal static async Task EnsureDeviceAsync(AtlasApiFixture atlas, string name, string csv, double? ratedKw = null)
    {
        var query = $"/api/v1/devices?name={Uri.EscapeDataString(name)}&file_name={Uri.EscapeDataString(name)}.csv" +
                    (ratedKw is { } r ? "&rated_kw=" + r.ToString(CultureInfo.InvariantCulture) : "");
        var response = await AssessmentAtlas.Writer(atlas).PostAsync(query, new StringContent(csv, Encoding.UTF8, "text/csv"));
        Assert.True(response.StatusCode is HttpStatusCode.Created or HttpStatusCode.OK, await response.Content.ReadAsStringAsync());
    }

    [Theory]
    [InlineData(5, 4, "bilinear")]
    [InlineData(3, 4, "bilinear")]  // the column with missing steps
    [InlineData(5, 4, "nearest")]
    public async Task YieldEndpointEqualsTheLibraryOnTheSameSeries(int i, int j, string interpolation)
    {
        await EnsureDeviceAsync(atlas, "Test Absorber", AbsorberCsv());
        var root = await AssessmentAtlas.JsonAsync(await _client.GetAsync($"{Point(i, j)}&device=test-absorber&interpolation={interpolation}"));
        // The library (Atlas.Assessment DeviceYield) on the decoded series the API reads: equal to 1e-12 relative.
        var (times, hs, te, _, _) = AssessmentAtlas.CoastSeries(i, j);
        var matrix = PowerMatrixCsv.Parse(new StringReader(AbsorberCsv()), "Test Absorber");
        var expected = DeviceYield.FromSeries(matrix, AssessmentAtlas.Regular(times, hs), AssessmentAtlas.Regular(times, te), WavePeriodKind.EnergyPeriod,
            new YieldOptions { Interpolation = interpolation == "nearest" ? PowerMatrixInterpolation.NearestBin : PowerMatrixInterpolation.Bilinear });
        Close(expected.AnnualEnergyMwh, root.GetProperty("annual_energy_mwh"));
        Close(expected.CapacityFactor, root.GetProperty("capacity_factor"));
        Close(expected.MeanPowerKw, root.GetProperty("mean_power_kw"));
        Close(expected.OutsideMatrixFraction, root.GetProperty("outside_matrix_fraction"));
        Close(expected.InterannualCoefficientOfVariation, root.GetProperty("interannual_cv"));
        Assert.Equal(expected.OutsideMatrixSteps, root.GetProperty("outside_matrix_steps").GetInt32());
        Assert.Equal(expected.MissingSteps, root.GetProperty("missing_steps").GetInt32());
        Assert.Equal(i == 3, expected.MissingSteps > 0);
        Assert.Equal(interpolation, root.GetProperty("interpolation").GetString());
        Assert.Equal("te as stored", root.GetProperty("period_source").GetString());
        var months = root.GetProperty("months").EnumerateArray().ToArray();
        for (var m = 0; m < 12; m++) Close(expected.Months[m].MeanEnergyMwh, months[m].GetProperty("mean_energy_mwh"));
        var years = root.GetProperty("years").EnumerateArray().ToArray();
        Assert.Equal(SyntheticAtlas.Years, years.Select(y => y.GetProperty("year").GetInt32()).ToArray());
        for (var y = 0; y < years.Length; y++) Close(expected.Years[y].EnergyMwh, years[y].GetProperty("energy_mwh"));
        Assert.Equal(Atlas.Api.Model.AtlasCaution.Text, root.GetProperty("caution").GetString());
        Assert.Equal(SyntheticAtlas.SourceFileName, root.GetProperty("provenance").GetProperty("source_files")[0].GetProperty("name").GetString());
    }

    private static void Close(double expected, JsonElement actual) => Assert.Equal(expected, actual.GetDouble(), Math.Abs(expected) * 1e-12);

    [Fact]
    public async Task AConstantMatrixGivesACapacityFactorOfTheConstantOverTheRatedPower()
    {
        // 300 kW everywhere on bins wide enough to hold every sea state (Hs -15..45 m, Te -17..59 s by the half-bin edges).
        await EnsureDeviceAsync(atlas, "Flat Device", "hs_m\\te_s,2,40\n0,300,300\n30,300,300\n", ratedKw: 1200);
        var root = await AssessmentAtlas.JsonAsync(await _client.GetAsync($"{Point(3, 4)}&device=flat-device"));
        // By hand: capacity factor = 300 / 1200; annual energy = 300 kW x 8766 h / 1000 = 2629.8 MWh, whatever steps are missing.
        Assert.Equal(0.25, root.GetProperty("capacity_factor").GetDouble(), 1e-12);
        Assert.Equal(2629.8, root.GetProperty("annual_energy_mwh").GetDouble(), 1e-9);
        Assert.Equal(0, root.GetProperty("outside_matrix_fraction").GetDouble());
        var (_, hs, te, _, _) = AssessmentAtlas.CoastSeries(3, 4);
        Assert.Equal(hs.Where((h, k) => float.IsNaN(h) || float.IsNaN(te[k])).Count(), root.GetProperty("missing_steps").GetInt32());
    }

    [Fact]
    public async Task SeaStatesBeyondTheMatrixAreCountedAtZeroNotHidden()
    {
        // Hs centres 0.5 and 1.0 m: the matrix covers Hs 0.25..1.25 m and Te 3.5..14.5 s.
        await EnsureDeviceAsync(atlas, "Calm Device", "hs_m\\te_s,4,6,8,10,12,14\n0.5,10,20,30,30,20,10\n1.0,40,80,120,120,80,40\n");
        var root = await AssessmentAtlas.JsonAsync(await _client.GetAsync($"{Point(5, 4)}&device=calm-device"));
        var (_, hs, te, _, _) = AssessmentAtlas.CoastSeries(5, 4);
        int outside = 0, valid = 0;
        for (var k = 0; k < hs.Length; k++)
        {
            if (float.IsNaN(hs[k]) || float.IsNaN(te[k])) continue;
            valid++;
            if (hs[k] < 0.25 || hs[k] > 1.25 || te[k] < 3.5 || te[k] > 14.5) outside++;
        }
        Assert.True(outside > valid / 2);  // the invented coast is mostly rougher than this device's matrix
        Assert.Equal(outside, root.GetProperty("outside_matrix_steps").GetInt32());
        Assert.Equal((double)outside / valid, root.GetProperty("outside_matrix_fraction").GetDouble(), 1e-12);
    }

    [Fact]
    public async Task APeakPeriodMatrixUsesTheStoredTp()
    {
        await EnsureDeviceAsync(atlas, "Tp Device", "hs_m\\tp_s,5,10,15\n1,50,100,50\n3,150,300,150\n");
        var root = await AssessmentAtlas.JsonAsync(await _client.GetAsync($"{Point(5, 4)}&device=tp-device"));
        Assert.Equal("tp as stored", root.GetProperty("period_source").GetString());
        Assert.Equal("tp", root.GetProperty("device").GetProperty("axis").GetString());
        var (times, hs, _, tp, _) = AssessmentAtlas.CoastSeries(5, 4);
        var matrix = PowerMatrixCsv.Parse(new StringReader("hs_m\\tp_s,5,10,15\n1,50,100,50\n3,150,300,150\n"), "Tp Device");
        var expected = DeviceYield.FromSeries(matrix, AssessmentAtlas.Regular(times, hs), AssessmentAtlas.Regular(times, tp), WavePeriodKind.PeakPeriod);
        Close(expected.AnnualEnergyMwh, root.GetProperty("annual_energy_mwh"));
    }

    [Fact]
    public async Task DeviceUploadsAreCheckedListedAndRemoved()
    {
        var writer = AssessmentAtlas.Writer(atlas);
        // Three faults, each with its line and column (counted by hand): Te bins out of order, a negative power, an empty cell.
        var bad = await Problems.AssertAsync(await writer.PostAsync("/api/v1/devices?name=Broken", new StringContent("hs_m\\te_s,8,6\n1,-5,10\n2,20,\n", Encoding.UTF8, "text/csv")),
            HttpStatusCode.BadRequest, "nothing was stored");
        var errors = bad.GetProperty("errors").GetProperty("file").EnumerateArray().Select(e => e.GetString()!).ToArray();
        Assert.Contains(errors, e => e.StartsWith("line 1, column 3: period bin centres must strictly increase", StringComparison.Ordinal));
        Assert.Contains(errors, e => e.StartsWith("line 2, column 2: power -5 kW is negative", StringComparison.Ordinal));
        Assert.Contains(errors, e => e.StartsWith("line 3, column 3: power cell is empty", StringComparison.Ordinal));
        await Problems.AssertAsync(await _client.GetAsync("/api/v1/devices/broken"), HttpStatusCode.NotFound);
        await Problems.AssertAsync(await writer.PostAsync("/api/v1/devices?name=Empty", new StringContent("hs_m\\te_s,6,8\n", Encoding.UTF8, "text/csv")),
            HttpStatusCode.BadRequest, "at least two are needed");
        await Problems.AssertAsync(await writer.PostAsync("/api/v1/devices?name=Underrated&rated_kw=5", new StringContent("hs_m\\te_s,6,8\n1,10,20\n2,30,40\n", Encoding.UTF8, "text/csv")),
            HttpStatusCode.BadRequest, "at least the largest matrix value");

        var form = new MultipartFormDataContent { { new StringContent("Form Device"), "name" }, { new StringContent("hs_m\\te_s,6,8\n1,10,20\n2,30,40\n"), "file", "form.csv" } };
        Assert.Equal(HttpStatusCode.Created, (await writer.PostAsync("/api/v1/devices", form)).StatusCode);
        var again = new MultipartFormDataContent { { new StringContent("Form Device"), "name" }, { new StringContent("hs_m\\te_s,6,8\n1,10,20\n2,30,40\n"), "file", "form.csv" } };
        Assert.True((await AssessmentAtlas.JsonAsync(await writer.PostAsync("/api/v1/devices", again))).GetProperty("already_registered").GetBoolean());
        await Problems.AssertAsync(await writer.PostAsync("/api/v1/devices?name=Form%20Device", new StringContent("hs_m\\te_s,6,8\n1,11,20\n2,30,40\n", Encoding.UTF8, "text/csv")),
            HttpStatusCode.Conflict, "another matrix");
        var list = await AssessmentAtlas.JsonAsync(await _client.GetAsync("/api/v1/devices"));
        var item = list.GetProperty("devices").EnumerateArray().Single(d => d.GetProperty("slug").GetString() == "form-device");
        Assert.Equal(40, item.GetProperty("rated_power_kw").GetDouble());
        Assert.Equal([0.5, 2.5], item.GetProperty("hs_range_m").EnumerateArray().Select(x => x.GetDouble()).ToArray());
        Assert.Contains("bilinear", list.GetProperty("interpolation").GetString());

        await Problems.AssertAsync(await _client.DeleteAsync("/api/v1/devices/form-device"), HttpStatusCode.Unauthorized);
        await Problems.AssertAsync(await _client.PostAsync("/api/v1/devices?name=Keyless", new StringContent("hs_m\\te_s,6,8\n1,10,20\n2,30,40\n", Encoding.UTF8, "text/csv")),
            HttpStatusCode.Unauthorized);
        Assert.Equal(HttpStatusCode.NoContent, (await writer.DeleteAsync("/api/v1/devices/form-device")).StatusCode);
        await Problems.AssertAsync(await writer.DeleteAsync("/api/v1/devices/form-device"), HttpStatusCode.NotFound, "GET /api/v1/devices");
    }

    [Fact]
    public async Task BadYieldRequestsAreProblems()
    {
        await EnsureDeviceAsync(atlas, "Test Absorber", AbsorberCsv());
        await Problems.AssertAsync(await _client.GetAsync(Point(5, 4)), HttpStatusCode.BadRequest, "device is required");
        await Problems.AssertAsync(await _client.GetAsync($"{Point(5, 4)}&device=no-such-device"), HttpStatusCode.NotFound, "no device 'no-such-device'");
        await Problems.AssertAsync(await _client.GetAsync($"{Point(5, 4)}&device=test-absorber&interpolation=cubic"), HttpStatusCode.BadRequest, "bilinear or nearest");
        await Problems.AssertAsync(await _client.GetAsync($"/api/v1/datasets/{SyntheticAtlas.CoastSlug}/point/yield?lon=20.5&device=test-absorber"), HttpStatusCode.BadRequest, "lat is required");
        await Problems.AssertAsync(await _client.GetAsync("/api/v1/datasets/no-such-run/point/yield?lat=40.4&lon=20.5&device=test-absorber"), HttpStatusCode.NotFound);
        await Problems.AssertAsync(await _client.GetAsync($"/api/v1/datasets/{SyntheticAtlas.CoastSlug}/point/yield?lat=10&lon=20.5&device=test-absorber"),
            HttpStatusCode.UnprocessableEntity, "outside");
    }
}
