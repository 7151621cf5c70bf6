using System.Globalization;
using System.Net;
using System.Text.Json;
using System.Text;
using Atlas.Api.Assessment;
using Atlas.Api.Tests.Support;
using Atlas.Ingest.Validation;
using Atlas.Storage.Datasets;
using Microsoft.Extensions.Configuration;
using Microsoft.Extensions.DependencyInjection;
using Atlas.TestSupport;

namespace Atlas.Api.Tests.Assessment;

[Collection(AtlasApiCollection.Name)]
public sealed class ValidationApiTests(AtlasApiFixture atlas)
{
    private readonly HttpClient _client = atlas.Factory.CreateClient();
    private static readonly HashSet<int> FlaggedRows = [3, 100, 101, 500, 900];
    private const double Offset = 0.25, Noise = 0.05;

    private static string Coast => $"/api/v1/datasets/{SyntheticAtlas.CoastSlug}";

    /// <summary>"Offset Buoy" at test-coast cell (5, 4): the stored Hs + 0.25 m + N(0, 0.05) noise, every 50 minutes.</summary>
    private async Task<List<(long Time, double Observed, double Modelled, bool Flagged)>> OffsetBuoyAsync()
    {
        await AssessmentAtlas.EnsureSeededAsync(atlas);
        var (csv, rows) = AssessmentAtlas.OffsetRecord(5, 4, Offset, Noise, seed: 11, FlaggedRows);
        var response = await AssessmentAtlas.PostStationAsync(AssessmentAtlas.Writer(atlas), "Offset Buoy", SyntheticAtlas.Latitude(4), SyntheticAtlas.Longitude(5), "validation", csv, "offset-buoy.csv");
        Assert.True(response.StatusCode is HttpStatusCode.Created or HttpStatusCode.OK, await response.Content.ReadAsStringAsync());
        return rows;
    }

    private static JsonElement Hs(JsonElement station) =>
        station.GetProperty("variables").EnumerateArray().Single(v => v.GetProperty("variable").GetString() == "hs");

    [Fact]
    public async Task SyntheticStationWithAKnownOffsetRecoversThatBiasThroughTheEndpoint()
    {
        var rows = await OffsetBuoyAsync();
        var root = await AssessmentAtlas.JsonAsync(await _client.GetAsync($"{Coast}/validation?station=offset-buoy"));
        var station = root.GetProperty("stations").EnumerateArray().Single();
        Assert.True(station.GetProperty("station").GetProperty("independent").GetBoolean());
        Assert.Equal(SyntheticAtlas.CellId(5, 4), station.GetProperty("cell").GetProperty("id").GetInt32());
        var hs = Hs(station);
        var counts = hs.GetProperty("counts");
        Assert.Equal(rows.Count, counts.GetProperty("offered").GetInt32());
        Assert.Equal(FlaggedRows.Count, counts.GetProperty("flagged").GetInt32());
        Assert.Equal(rows.Count - FlaggedRows.Count, counts.GetProperty("matched").GetInt32());

        var overall = hs.GetProperty("overall");
        var n = rows.Count - FlaggedRows.Count;
        // The record is the model + 0.25 m: bias = mean(model - observed) = -0.25 m, up to the noise mean
        // (standard error 0.05 / sqrt(n) = 0.0008 m here) and the 1 mm rounding of the record; tolerance 0.003 m.
        Assert.Equal(-Offset, overall.GetProperty("bias").GetDouble(), 0.003);
        // RMSE^2 = offset^2 + noise^2 for independent noise, so SI = sqrt(0.0625 + 0.0025) / mean observed (tolerance 2 %).
        var meanObserved = rows.Where(r => !r.Flagged).Average(r => r.Observed);
        var expectedSi = Math.Sqrt(Offset * Offset + Noise * Noise) / meanObserved;
        Assert.Equal(expectedSi, overall.GetProperty("scatter_index").GetDouble(), expectedSi * 0.02);
        Assert.Equal(meanObserved, overall.GetProperty("mean_observed").GetDouble(), 1e-6);
        Assert.Equal(n, overall.GetProperty("n").GetInt32());
        Assert.Equal(AtlasApiFixtureCaution, root.GetProperty("caution").GetString());
        Assert.Equal(SyntheticAtlas.CoastSlug, root.GetProperty("provenance").GetProperty("dataset").GetString());
    }

    private static string AtlasApiFixtureCaution => Atlas.Api.Model.AtlasCaution.Text;

    [Fact]
    public async Task SkillAgreesWithNumPyOnTheServedPairs()
    {
        await OffsetBuoyAsync();
        // The pairs CSV opens as it is (GDAL, pandas, its CSVW metadata: see CsvDownloadCheck).
        var csv = (await CsvDownloadCheck.AssertAsync(_client, $"{Coast}/validation/offset-buoy/pairs?format=csv")).Csv;
        var path = ExternalTool.TempFile(".csv");
        await File.WriteAllTextAsync(path, csv);
        var numpy = JsonDocument.Parse(ExternalTool.Run(ExternalTool.Python,
            Path.Combine(AssessmentAtlas.Checkout, "tests", "Atlas.Api.Tests", "Assessment", "skill_reference.py"), path)).RootElement;
        var overall = Hs((await AssessmentAtlas.JsonAsync(await _client.GetAsync($"{Coast}/validation?station=offset-buoy"))).GetProperty("stations")[0]).GetProperty("overall");
        // NumPy (skill_reference.py) on the same pairs, written with round-trip precision: relative 1e-9.
        Assert.Equal(numpy.GetProperty("n").GetInt32(), overall.GetProperty("n").GetInt32());
        foreach (var name in new[] { "bias", "rmse", "scatter_index", "pearson_r", "symmetric_slope" })
        {
            var expected = numpy.GetProperty(name).GetDouble();
            Assert.Equal(expected, overall.GetProperty(name).GetDouble(), Math.Abs(expected) * 1e-9);
        }
    }

    [Fact]
    public async Task ModelledValuesAreTheStoredSeriesInterpolatedBetweenTheBracketingSteps()
    {
        var rows = (await OffsetBuoyAsync()).Where(r => !r.Flagged).ToArray();
        var plot = await AssessmentAtlas.JsonAsync(await _client.GetAsync($"{Coast}/validation/offset-buoy/pairs"));
        var pairs = plot.GetProperty("pairs").EnumerateArray().ToArray();
        Assert.Equal(rows.Length, pairs.Length);
        for (var k = 0; k < rows.Length; k++)
        {
            Assert.Equal(DateTimeOffset.FromUnixTimeSeconds(rows[k].Time).UtcDateTime, pairs[k].GetProperty("time").GetDateTime().ToUniversalTime());
            // The test's own linear interpolation of the decoded float32 series: 1e-6 m.
            Assert.Equal(rows[k].Modelled, pairs[k].GetProperty("modelled").GetDouble(), 1e-6);
            Assert.Equal(rows[k].Observed, pairs[k].GetProperty("observed").GetDouble(), 1e-6);
        }
        Assert.Equal(99, plot.GetProperty("quantiles").GetArrayLength());
        Assert.Equal(0, plot.GetProperty("one_to_one_line")[0].GetDouble());
        Assert.True(plot.GetProperty("model_series").GetArrayLength() > 700);  // 3-hourly over Feb..Apr 2019
    }

    [Fact]
    public async Task ModelGapsAndFlaggedRowsAreCountedAndNeverPaired()
    {
        await AssessmentAtlas.EnsureSeededAsync(atlas);
        // Column 3 of test-coast misses every 50th step; count by hand which observations it leaves without a bracket.
        var (times, hs, _, _, _) = AssessmentAtlas.CoastSeries(3, 4);
        var (csv, rows) = AssessmentAtlas.OffsetRecord(3, 4, 0.1, 0.02, seed: 5, new HashSet<int> { 0, 1 });
        var response = await AssessmentAtlas.PostStationAsync(AssessmentAtlas.Writer(atlas), "Gap Buoy", SyntheticAtlas.Latitude(4), SyntheticAtlas.Longitude(3), "calibration", csv, "gap-buoy.csv");
        Assert.True(response.IsSuccessStatusCode, await response.Content.ReadAsStringAsync());
        var missing = rows.Count(r =>
        {
            if (r.Flagged) return false;
            var k = Array.BinarySearch(times, r.Time);
            return k >= 0 ? float.IsNaN(hs[k]) : float.IsNaN(hs[~k - 1]) || float.IsNaN(hs[~k]);
        });
        Assert.True(missing > 0);
        var station = (await AssessmentAtlas.JsonAsync(await _client.GetAsync($"{Coast}/validation?station=Gap%20Buoy"))).GetProperty("stations")[0];
        Assert.False(station.GetProperty("station").GetProperty("independent").GetBoolean());
        var counts = Hs(station).GetProperty("counts");
        Assert.Equal(2, counts.GetProperty("flagged").GetInt32());
        Assert.Equal(missing, counts.GetProperty("model_missing").GetInt32());
        Assert.Equal(0, counts.GetProperty("model_gap").GetInt32());
        Assert.Equal(rows.Count - 2 - missing, counts.GetProperty("matched").GetInt32());
    }

    [Fact]
    public async Task SeasonAndHsClassGroupsPartitionThePairs()
    {
        await OffsetBuoyAsync();
        var hs = Hs((await AssessmentAtlas.JsonAsync(await _client.GetAsync($"{Coast}/validation?station=offset-buoy"))).GetProperty("stations")[0]);
        var n = hs.GetProperty("overall").GetProperty("n").GetInt32();
        var seasons = hs.GetProperty("by_season").EnumerateArray().ToArray();
        Assert.Equal(["djf", "mam", "jja", "son"], seasons.Select(s => s.GetProperty("season").GetString()!).ToArray());
        Assert.Equal(n, seasons.Sum(s => s.GetProperty("skill").GetProperty("n").GetInt32()));
        Assert.Equal(0, seasons[2].GetProperty("skill").GetProperty("n").GetInt32());  // the record has no summer
        var classes = hs.GetProperty("by_hs_class").EnumerateArray().ToArray();
        Assert.Equal([0.0, 1, 2, 3, 4], classes.Select(c => c.GetProperty("hs_lower_m").GetDouble()).ToArray());
        Assert.Equal(JsonValueKind.Null, classes[^1].GetProperty("hs_upper_m").ValueKind);
        Assert.Equal(n, classes.Sum(c => c.GetProperty("skill").GetProperty("n").GetInt32()));
    }

    [Fact]
    public async Task ValidationCsvGivesARowPerStationVariableAndGroupWithTheProvenanceInItsMetadata()
    {
        await OffsetBuoyAsync();
        // GDAL, pandas and the CSVW structure: see CsvDownloadCheck.
        var download = await CsvDownloadCheck.AssertAsync(_client, $"{Coast}/validation?station=offset-buoy&format=csv");
        Assert.Contains(Atlas.Api.Model.AtlasCaution.Text, CsvDownloadCheck.Notes(download.Metadata));
        Assert.Contains(SyntheticAtlas.SourceFileName, CsvDownloadCheck.SourceFiles(download.Metadata));
        var data = download.Csv.Split("\r\n", StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal("station,role,independent,cell_id,distance_m,variable,group,n,mean_observed,mean_modelled,bias,rmse,scatter_index,pearson_r,symmetric_slope", data[0]);
        // hs only (the record has no period or direction): overall, four seasons, five Hs classes.
        Assert.Equal(10, data.Length - 1);
        Assert.StartsWith($"Offset Buoy,validation,true,{SyntheticAtlas.CellId(5, 4)},0,hs,overall,", data[1], StringComparison.Ordinal);
    }

    [Fact]
    public async Task RunsAreRankedByScatterIndexStationByStationWithTheirBias()
    {
        await OffsetBuoyAsync();
        var root = await AssessmentAtlas.JsonAsync(await _client.GetAsync($"/api/v1/validation/compare?datasets={AssessmentAtlas.ScaledSlug},{SyntheticAtlas.CoastSlug}"));
        var station = root.GetProperty("stations").EnumerateArray().Single(s => s.GetProperty("station").GetString() == "Offset Buoy");
        var runs = station.GetProperty("runs").EnumerateArray().ToArray();
        // assess-scaled holds Hs x 0.8: its bias is that of test-coast minus 0.2 mean Hs, and its scatter index larger.
        Assert.Equal(SyntheticAtlas.CoastSlug, runs[0].GetProperty("dataset").GetString());
        Assert.Equal(1, runs[0].GetProperty("rank").GetInt32());
        Assert.Equal(AssessmentAtlas.ScaledSlug, runs[1].GetProperty("dataset").GetString());
        Assert.Equal(2, runs[1].GetProperty("rank").GetInt32());
        var coastSkill = runs[0].GetProperty("skill");
        var scaledSkill = runs[1].GetProperty("skill");
        Assert.True(scaledSkill.GetProperty("scatter_index").GetDouble() > coastSkill.GetProperty("scatter_index").GetDouble());
        var meanModelled = coastSkill.GetProperty("mean_modelled").GetDouble();
        Assert.Equal(coastSkill.GetProperty("bias").GetDouble() + (AssessmentAtlas.HsScale - 1) * meanModelled, scaledSkill.GetProperty("bias").GetDouble(), 2e-3);
        Assert.Equal(SyntheticAtlas.CoastSlug, root.GetProperty("ranking")[0].GetProperty("dataset").GetString());
        Assert.Equal(2, root.GetProperty("provenance").GetArrayLength());
    }

    [Fact]
    public async Task AStationOutsideTheDatasetIsListedAsNotCovered()
    {
        await OffsetBuoyAsync();
        var root = await AssessmentAtlas.JsonAsync(await _client.GetAsync($"/api/v1/datasets/{AssessmentAtlas.LongSlug}/validation?station=offset-buoy"));
        Assert.Equal(0, root.GetProperty("stations").GetArrayLength());
        Assert.Contains("outside dataset", root.GetProperty("not_covered")[0].GetProperty("reason").GetString());
        await Problems.AssertAsync(await _client.GetAsync($"/api/v1/datasets/{AssessmentAtlas.LongSlug}/validation/offset-buoy/pairs"),
            HttpStatusCode.UnprocessableEntity, "outside dataset");
    }

    // One broken rule per record; line numbers counted by hand in the text (the header is line 1).
    [Theory]
    [InlineData("time,height\n2019-02-01T00:00:00Z,1.0\n", "line 1, column 2: unknown column 'height'")]
    [InlineData("time,hs_m\n2019-02-01T00:00:00Z,1.0\n2019-02-01 01:00,1.1\n", "line 3, column 1: time '2019-02-01 01:00' is not an ISO 8601 UTC time")]
    [InlineData("time,hs_m\n2019-02-01T00:00:00Z,1.0\n2019-02-01T01:00:00Z,-0.2\n", "line 3, column 2: hs_m -0.2 is negative")]
    [InlineData("time,hs_m\n2019-02-01T00:00:00Z,1.0\n2019-02-01T00:00:00Z,1.2\n", "line 3: duplicate time 2019-02-01T00:00:00Z, already on line 2")]
    public async Task BadStationRecordsGiveLineNumberedErrorsAndStoreNothing(string csv, string expected)
    {
        var name = "Bad Buoy " + Math.Abs(expected.GetHashCode());
        var problem = await Problems.AssertAsync(await AssessmentAtlas.PostStationAsync(AssessmentAtlas.Writer(atlas), name, 40.4, 20.5, "validation", csv),
            HttpStatusCode.BadRequest);
        Assert.Contains(problem.GetProperty("errors").GetProperty("file").EnumerateArray(), e => e.GetString()!.StartsWith(expected, StringComparison.Ordinal));
        Assert.Contains("nothing was stored", problem.GetProperty("title").GetString());
        await Problems.AssertAsync(await _client.GetAsync($"/api/v1/stations/{Uri.EscapeDataString(name)}"), HttpStatusCode.NotFound);
    }

    [Fact]
    public async Task AStationDescriptionWithoutPositionOrRoleIsRefusedFieldByField()
    {
        var form = new MultipartFormDataContent { { new StringContent("Nameless"), "name" }, { new StringContent("north"), "lat" }, { new StringContent("time,hs_m\n"), "file", "r.csv" } };
        var problem = await Problems.AssertAsync(await AssessmentAtlas.Writer(atlas).PostAsync("/api/v1/stations", form), HttpStatusCode.BadRequest);
        var errors = problem.GetProperty("errors");
        Assert.Contains("'north' is not a number", errors.GetProperty("lat")[0].GetString());
        Assert.Contains("lon is required", errors.GetProperty("lon")[0].GetString());
        Assert.Contains("calibration", errors.GetProperty("role")[0].GetString());
        Assert.Contains("instrument is required", errors.GetProperty("instrument")[0].GetString());
    }

    [Fact]
    public async Task StationWritesNeedTheApiKey()
    {
        var csv = "time,hs_m\n2019-02-01T00:00:00Z,1.0\n";
        await Problems.AssertAsync(await AssessmentAtlas.PostStationAsync(_client, "Keyless Buoy", 40.4, 20.5, "validation", csv), HttpStatusCode.Unauthorized, "X-Api-Key");
        var wrong = atlas.Factory.CreateClient();
        wrong.DefaultRequestHeaders.Add("X-Api-Key", "not-the-key");
        await Problems.AssertAsync(await AssessmentAtlas.PostStationAsync(wrong, "Keyless Buoy", 40.4, 20.5, "validation", csv), HttpStatusCode.Unauthorized, "not one this server accepts");
        await Problems.AssertAsync(await _client.DeleteAsync("/api/v1/stations/keyless-buoy"), HttpStatusCode.Unauthorized);
        await Problems.AssertAsync(await _client.GetAsync("/api/v1/stations/keyless-buoy"), HttpStatusCode.NotFound);
    }

    [Fact]
    public async Task ReloadingAStationChangesNothingAndDeletingRemovesIt()
    {
        var writer = AssessmentAtlas.Writer(atlas);
        var csv = "time,hs_m,tp_s,qc\n2019-02-01T00:00:00Z,1.0,8,0\n2019-02-01T01:00:00Z,1.1,,0\n2019-02-01T02:00:00Z,,,2\n";
        Assert.Equal(HttpStatusCode.Created, (await AssessmentAtlas.PostStationAsync(writer, "Short Buoy", 40.4, 20.5, "calibration", csv)).StatusCode);
        var again = await AssessmentAtlas.JsonAsync(await AssessmentAtlas.PostStationAsync(writer, "Short Buoy", 40.4, 20.5, "calibration", csv));
        Assert.True(again.GetProperty("already_registered").GetBoolean());
        Assert.Equal(1, again.GetProperty("station").GetProperty("flagged_count").GetInt32());
        Assert.Equal(["hs", "tp"], again.GetProperty("station").GetProperty("variables").EnumerateArray().Select(v => v.GetString()!).ToArray());
        await Problems.AssertAsync(await AssessmentAtlas.PostStationAsync(writer, "Short Buoy", 40.4, 20.5, "calibration", csv + "2019-02-01T03:00:00Z,1.2,,0\n"),
            HttpStatusCode.Conflict, "another record");
        var list = await AssessmentAtlas.JsonAsync(await _client.GetAsync("/api/v1/stations"));
        Assert.Contains("short-buoy", list.GetProperty("stations").EnumerateArray().Select(s => s.GetProperty("slug").GetString()));
        Assert.Equal(HttpStatusCode.NoContent, (await writer.DeleteAsync("/api/v1/stations/short-buoy")).StatusCode);
        await Problems.AssertAsync(await _client.GetAsync("/api/v1/stations/short-buoy"), HttpStatusCode.NotFound);
    }

    [Fact]
    public async Task UnknownDatasetsStationsAndBadQueryValuesAreProblems()
    {
        await OffsetBuoyAsync();
        await Problems.AssertAsync(await _client.GetAsync("/api/v1/datasets/no-such-run/validation"), HttpStatusCode.NotFound, "no dataset 'no-such-run'");
        await Problems.AssertAsync(await _client.GetAsync($"{Coast}/validation?station=no-such-buoy"), HttpStatusCode.NotFound, "GET /api/v1/stations");
        await Problems.AssertAsync(await _client.GetAsync($"{Coast}/validation?format=xml"), HttpStatusCode.BadRequest, "json or csv");
        await Problems.AssertAsync(await _client.GetAsync($"{Coast}/validation/offset-buoy/pairs?variable=swh"), HttpStatusCode.BadRequest, "hs, tp, te or dir");
        await Problems.AssertAsync(await _client.GetAsync($"{Coast}/validation/offset-buoy/pairs?variable=tp"), HttpStatusCode.UnprocessableEntity, "station record has no tp");
        await Problems.AssertAsync(await _client.GetAsync("/api/v1/validation/compare?datasets=test-coast"), HttpStatusCode.BadRequest, "two or more");
        await Problems.AssertAsync(await _client.GetAsync("/api/v1/validation/compare?datasets=test-coast,no-such-run"), HttpStatusCode.NotFound, "no-such-run");
        await Problems.AssertAsync(await _client.GetAsync("/api/v1/validation/compare?datasets=test-coast,assess-scaled&variable=dir"), HttpStatusCode.BadRequest, "scatter index");
    }

    [Fact]
    public async Task TheStoredValidationSummaryReachesTheCatalogue()
    {
        await OffsetBuoyAsync();
        // What `atlas validate` does: validate at every station and merge the summary into the dataset metadata.
        var registrations = new ServiceCollection()
            .AddSingleton<IConfiguration>(new ConfigurationBuilder().Build())
            .AddSingleton(atlas.DataSource)
            .AddStationValidation();
        await using var provider = registrations.BuildServiceProvider();
        var service = provider.GetRequiredService<ValidationService>();
        var datasets = new DatasetStore(atlas.DataSource);
        var dataset = (await datasets.FindAsync(AssessmentAtlas.ScaledSlug))!;
        var (covered, notCovered) = await service.AtStationsAsync(dataset, await service.Stations.ListAsync(), CancellationToken.None);
        await datasets.MergeMetadataAsync(dataset.Id, ValidationReporting.MetadataJson(covered, notCovered, DateTime.UtcNow));
        var detail = await AssessmentAtlas.JsonAsync(await _client.GetAsync($"/api/v1/datasets/{AssessmentAtlas.ScaledSlug}"));
        var stations = detail.GetProperty("validation").GetProperty("stations").EnumerateArray().ToArray();
        var offset = stations.Single(s => s.GetProperty("station").GetString() == "Offset Buoy");
        var expected = covered.Single(s => s.Station.Name == "Offset Buoy").Find("hs")!.Overall!;
        Assert.Equal(expected.ScatterIndex!.Value, offset.GetProperty("variables").GetProperty("hs").GetProperty("scatter_index").GetDouble(), 1e-12);
        Assert.Equal("validation", offset.GetProperty("role").GetString());
        // ... and the head of the assessment downloads of that dataset (once the server's few-second row cache lets go,
        // which the test does at once rather than wait).
        atlas.Factory.Services.GetRequiredService<Atlas.Api.Catalog.DatasetCatalog>().Forget(AssessmentAtlas.ScaledSlug);
        var download = await CsvDownloadCheck.AssertAsync(_client, $"/api/v1/datasets/{AssessmentAtlas.ScaledSlug}/layers/accessibility.csv?hs_max=2");
        Assert.Contains(string.Create(CultureInfo.InvariantCulture, $"Validation: Offset Buoy (validation): hs N={expected.N}, bias={expected.Bias:0.###} m"),
            CsvDownloadCheck.Notes(download.Metadata));
    }
}
