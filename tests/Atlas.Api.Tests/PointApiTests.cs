using System.Globalization;
using System.Net;
using System.Text.Json;
using Atlas.Api.Infrastructure;
using Atlas.Api.Model;
using Atlas.Api.Tests.Support;
using Atlas.Storage.Statistics;
using Atlas.TestSupport;
using Microsoft.Data.Analysis;

namespace Atlas.Api.Tests;

[Collection(AtlasApiCollection.Name)]
public sealed class PointApiTests(AtlasApiFixture atlas)
{
    private readonly HttpClient _client = atlas.Factory.CreateClient();
    private static readonly string Point = $"/api/v1/datasets/{SyntheticAtlas.CoastSlug}/point";

    private static string At(int i, int j) =>
        string.Create(CultureInfo.InvariantCulture, $"lat={SyntheticAtlas.Latitude(j)}&lon={SyntheticAtlas.Longitude(i)}");

    private async Task<Dictionary<(short Period, short Parameter), StatisticRow>> StoredAsync(int cellId)
    {
        var dataset = (await new Atlas.Storage.Datasets.DatasetStore(atlas.DataSource).FindAsync(SyntheticAtlas.CoastSlug))!;
        return (await new StatisticsStore(atlas.DataSource).ForCellAsync(dataset.Id, cellId)).ToDictionary(r => (r.Period.Code, (short)r.Parameter));
    }

    private static JsonElement PeriodOf(JsonElement root, string name) =>
        root.GetProperty("periods").EnumerateArray().Single(p => p.GetProperty("period").GetString() == name);

    [Theory]
    [InlineData(5, 4)]
    [InlineData(3, 7)]  // the column with missing steps
    [InlineData(0, 0)]  // the cell with no depth: deep-water power
    public async Task PointMeansEqualTheStoredNumPyStatistics(int i, int j)
    {
        var root = JsonDocument.Parse(await _client.GetStringAsync($"{Point}?{At(i, j)}&include=none")).RootElement;
        Assert.Equal(SyntheticAtlas.CellId(i, j), root.GetProperty("cell").GetProperty("id").GetInt32());
        Assert.Equal(i == 0 && j == 0, root.GetProperty("deep_water_assumed").GetBoolean());
        var stored = await StoredAsync(SyntheticAtlas.CellId(i, j));
        foreach (var (name, code) in new[] { ("annual", (short)0), ("jan", (short)1), ("jja", (short)15), ("y2019", (short)2019) })
        {
            var period = PeriodOf(root, name);
            foreach (var (symbol, parameter) in new[] { ("hs", (short)0), ("te", (short)1), ("tp", (short)2), ("j", (short)3), ("spread", (short)5) })
            {
                var expected = stored[(code, parameter)];
                var got = period.GetProperty(symbol);
                // NumPy reference (Reference/synthetic_statistics.py), stored as float32: relative tolerance 2e-6 for the
                // means and exact percentiles (type 7 on both sides); the power table of the library is within 2e-7.
                Assert.Equal(expected.Mean!.Value, got.GetProperty("mean").GetDouble(), (double)Math.Abs(expected.Mean.Value) * 2e-6);
                Assert.Equal(expected.P90!.Value, got.GetProperty("p90").GetDouble(), (double)Math.Abs(expected.P90.Value) * 2e-6);
                Assert.Equal(expected.Sd!.Value, got.GetProperty("sd").GetDouble(), (double)Math.Abs(expected.Sd.Value) * 1e-5);
                Assert.Equal(expected.Count, got.GetProperty("count").GetInt64());
                Assert.Equal(expected.Coverage, got.GetProperty("coverage").GetDouble(), 1e-6);
            }
            // Power-weighted circular mean direction: NumPy arctan2 of the weighted sums; 0.001 degree.
            Assert.Equal(stored[(code, 4)].Mean!.Value, period.GetProperty("direction").GetProperty("mean").GetDouble(), 1e-3);
        }
    }

    [Theory]
    [InlineData(5, 4)]
    [InlineData(3, 7)]
    [InlineData(0, 0)]
    public async Task PointMeansEqualTheStatisticsServiceRowsOfTheSameSeries(int i, int j)
    {
        // The same series with statistics from the layer pass: means, counts and coverage must agree with the exact
        // point computation (float32 storage: 2e-6 relative); layer percentiles are histogram estimates, not compared.
        var dataset = (await new Atlas.Storage.Datasets.DatasetStore(atlas.DataSource).FindAsync(SyntheticAtlas.ServiceSlug))!;
        var stored = (await new StatisticsStore(atlas.DataSource).ForCellAsync(dataset.Id, SyntheticAtlas.CellId(i, j))).ToDictionary(r => (r.Period.Code, (short)r.Parameter));
        var root = JsonDocument.Parse(await _client.GetStringAsync($"/api/v1/datasets/{SyntheticAtlas.ServiceSlug}/point?{At(i, j)}&include=none")).RootElement;
        foreach (var period in root.GetProperty("periods").EnumerateArray())
        {
            var code = AtlasPeriod.Parse(period.GetProperty("period").GetString()!).Code;
            foreach (var (symbol, parameter) in new[] { ("hs", (short)0), ("te", (short)1), ("tp", (short)2), ("j", (short)3), ("spread", (short)5), ("d", (short)6) })
            {
                var row = stored[(code, parameter)];
                var got = period.GetProperty(symbol);
                Assert.Equal(row.Mean!.Value, got.GetProperty("mean").GetDouble(), Math.Abs(row.Mean.Value) * 2e-6 + 1e-9);
                Assert.Equal(row.Count, got.GetProperty("count").GetInt64());
            }
            Assert.Equal(stored[(code, 4)].Mean!.Value, period.GetProperty("direction").GetProperty("mean").GetDouble(), 1e-3);
        }
    }

    [Fact]
    public async Task WindowOfOneYearOrOneMonthMatchesThatPeriodsStoredStatistics()
    {
        var stored = await StoredAsync(SyntheticAtlas.CellId(6, 2));
        var year = JsonDocument.Parse(await _client.GetStringAsync($"{Point}?{At(6, 2)}&from=2019&to=2019&period=annual&include=none")).RootElement;
        Assert.Equal(stored[(2019, 3)].Mean!.Value, PeriodOf(year, "annual").GetProperty("j").GetProperty("mean").GetDouble(), stored[(2019, 3)].Mean!.Value * 2e-6);
        Assert.Equal(2019, year.GetProperty("window").GetProperty("from_year").GetInt32());
        var january = JsonDocument.Parse(await _client.GetStringAsync($"{Point}?{At(6, 2)}&months=1&period=annual&include=none")).RootElement;
        Assert.Equal(stored[(1, 0)].Mean!.Value, PeriodOf(january, "annual").GetProperty("hs").GetProperty("mean").GetDouble(), stored[(1, 0)].Mean!.Value * 2e-6);
        Assert.Single(january.GetProperty("periods").EnumerateArray());
    }

    [Fact]
    public async Task ARepeatedPointRequestIsRevalidatedByItsETagUntilTheDatasetChanges()
    {
        var url = $"{Point}?{At(4, 3)}&include=rose";
        var first = await _client.GetAsync(url);
        var etag = first.Headers.ETag!;
        var body = await first.Content.ReadAsStringAsync();
        Assert.Equal(body, await _client.GetStringAsync(url));

        using var conditional = new HttpRequestMessage(HttpMethod.Get, url);
        conditional.Headers.IfNoneMatch.Add(etag);
        Assert.Equal(HttpStatusCode.NotModified, (await _client.SendAsync(conditional)).StatusCode);

        // A file loaded later (another process's ingest) changes the dataset's stamp: the answer is made afresh and
        // names the new file in its provenance, under a new tag.
        var sql = $"INSERT INTO source_file (dataset_id, file_name, checksum, size_bytes, time_start, time_end, step_count) " +
                  $"SELECT dataset_id, 'later-file.nc', 'blake3:' || repeat('ab', 32), 1, now(), now(), 1 FROM dataset WHERE slug = '{SyntheticAtlas.CoastSlug}'";
        await atlas.CountAsync(sql + " RETURNING 1");
        try
        {
            // The stamps are cached for two seconds; ask until the tag changes.
            var changed = await Patience.UntilAsync(() => _client.GetAsync(url), r => !r.Headers.ETag!.Equals(etag), "a new tag after the stamp changed");
            Assert.NotEqual(etag, changed.Headers.ETag);
            Assert.Contains("later-file.nc", await changed.Content.ReadAsStringAsync());
        }
        finally
        {
            await atlas.CountAsync("WITH gone AS (DELETE FROM source_file WHERE file_name = 'later-file.nc' RETURNING 1) SELECT count(*) FROM gone");
            // The next test of the shared dataset must not meet the cached stamp that still names the file (a figure's
            // provenance once counted two source files for a moment): ask until the answer no longer names it.
            await Patience.UntilAsync(() => _client.GetStringAsync(url), answer => !answer.Contains("later-file.nc"), "the answer without the removed file");
        }
    }

    [Fact]
    public async Task ClientsAcceptingGzipGetTheSameAnswerCompressed()
    {
        var url = $"{Point}?{At(4, 4)}&period=annual";
        var identity = await _client.GetByteArrayAsync(url);
        using var request = new HttpRequestMessage(HttpMethod.Get, url);
        request.Headers.AcceptEncoding.ParseAdd("gzip, br;q=0.5");
        var response = await _client.SendAsync(request);
        Assert.Equal("gzip", Assert.Single(response.Content.Headers.ContentEncoding));
        Assert.Contains("Accept-Encoding", response.Headers.Vary);
        var compressed = await response.Content.ReadAsByteArrayAsync();
        Assert.True(compressed.Length < identity.Length, $"gzip {compressed.Length} bytes, identity {identity.Length} bytes");
        // Decompressed by .NET's GZipStream (RFC 1952), byte for byte the identity answer.
        using var gzip = new System.IO.Compression.GZipStream(new MemoryStream(compressed), System.IO.Compression.CompressionMode.Decompress);
        using var plain = new MemoryStream();
        await gzip.CopyToAsync(plain);
        Assert.Equal(identity, plain.ToArray());
    }

    [Fact]
    public async Task IdenticalConcurrentPointRequestsAllGetTheSameAnswer()
    {
        var url = $"{Point}?lat=40.51&lon=20.49&include=joint";
        var bodies = await Task.WhenAll(Enumerable.Range(0, 16).Select(_ => _client.GetStringAsync(url)));
        Assert.Single(bodies.Distinct());
        Assert.Equal(SyntheticAtlas.CellId(5, 5), JsonDocument.Parse(bodies[0]).RootElement.GetProperty("cell").GetProperty("id").GetInt32());
    }

    [Fact]
    public async Task NearestWetCellAndItsGreatCircleDistanceAreReported()
    {
        var root = JsonDocument.Parse(await _client.GetStringAsync($"{Point}?lat=40.42&lon=20.33&include=none")).RootElement;
        var cell = root.GetProperty("cell");
        Assert.Equal(SyntheticAtlas.CellId(3, 4), cell.GetProperty("id").GetInt32());
        Assert.Equal(10f + 15f * 7, cell.GetProperty("depth_m").GetDouble(), 3);
        // Haversine on a sphere of the mean Earth radius 6371.0088 km (IUGG); the spheroid differs by under 0.5 %.
        static double Radians(double d) => d * Math.PI / 180;
        var (la1, lo1, la2, lo2) = (Radians(40.42), Radians(20.33), Radians(40.4), Radians(20.3));
        var h = Math.Pow(Math.Sin((la2 - la1) / 2), 2) + Math.Cos(la1) * Math.Cos(la2) * Math.Pow(Math.Sin((lo2 - lo1) / 2), 2);
        var haversine = 2 * 6371008.8 * Math.Asin(Math.Sqrt(h));
        Assert.Equal(haversine, cell.GetProperty("distance_m").GetDouble(), haversine * 0.005);
    }

    [Fact]
    public async Task SubResourcesCarryExceedanceJointTablePowerRoseAndInterAnnualMeans()
    {
        var root = JsonDocument.Parse(await _client.GetStringAsync($"{Point}?{At(5, 5)}&period=annual")).RootElement;
        var stored = await StoredAsync(SyntheticAtlas.CellId(5, 5));
        var curve = root.GetProperty("exceedance").GetProperty("hs");
        var thresholds = curve.GetProperty("thresholds").EnumerateArray().Select(t => t.GetDouble()).ToArray();
        var fractions = curve.GetProperty("fractions").EnumerateArray().Select(t => t.GetDouble()).ToArray();
        // NumPy's fraction of steps above 2 m (stored extra[1] of the hs row), against the curve at 2.0 m.
        var k = Array.FindIndex(thresholds, t => Math.Abs(t - 2.0) < 1e-9);
        Assert.Equal(stored[(0, 0)].Fractions![1], fractions[k], 1e-6);
        var joint = root.GetProperty("joint_occurrence");
        Assert.Equal(0.5, joint.GetProperty("hs_bin_width_metres").GetDouble());
        var total = joint.GetProperty("fraction_of_time").EnumerateArray().SelectMany(r => r.EnumerateArray()).Sum(v => v.GetDouble());
        Assert.Equal(1.0, total, 1e-9);
        var rose = root.GetProperty("power_rose").GetProperty("fractions").EnumerateArray().Select(v => v.GetDouble()).ToArray();
        Assert.Equal(16, rose.Length);
        // NumPy's power rose (stored extra of the dir row): 1e-5 per sector (float32 storage).
        for (var s = 0; s < 16; s++) Assert.Equal(stored[(0, 4)].Fractions![s], rose[s], 1e-5);
        var years = root.GetProperty("inter_annual").EnumerateArray().First(p => p.GetProperty("period").GetString() == "annual").GetProperty("years");
        Assert.Equal(stored[(2020, 0)].Mean!.Value, years.EnumerateArray().Single(y => y.GetProperty("year").GetInt32() == 2020).GetProperty("hs").GetDouble(), 1e-5);
        Assert.Equal(AtlasCaution.Text, root.GetProperty("caution").GetString());
        Assert.Equal(SyntheticAtlas.SourceChecksum, root.GetProperty("provenance").GetProperty("source_files")[0].GetProperty("checksum").GetString());
    }

    [Fact]
    public async Task CsvOpensAsItIsAndItsMetadataCarriesTheProvenance()
    {
        // GDAL, pandas and the CSVW structure: see CsvDownloadCheck.
        var download = await CsvDownloadCheck.AssertAsync(_client, $"{Point}?{At(5, 4)}&format=csv");
        Assert.Equal("period,parameter,mean,sd,min,max,p10,p50,p90,p99,count,coverage,low_coverage", string.Join(',', download.Header));
        var notes = CsvDownloadCheck.Notes(download.Metadata);
        Assert.Contains(AtlasCaution.Text, notes);
        Assert.Contains(SyntheticAtlas.SourceChecksum, CsvDownloadCheck.SourceChecksums(download.Metadata));
        Assert.Contains("j kW/m", notes);
        Assert.Contains($"{Point}?{At(5, 4)}&format=csvw", download.MetadataUrl);
        using var stream = new MemoryStream(System.Text.Encoding.UTF8.GetBytes(download.Csv));
        var frame = DataFrame.LoadCsv(stream);
        var stored = await StoredAsync(SyntheticAtlas.CellId(5, 4));
        var row = Enumerable.Range(0, (int)frame.Rows.Count).Single(r => (string)frame["period"][r] == "annual" && (string)frame["parameter"][r] == "hs");
        Assert.Equal(stored[(0, 0)].Mean!.Value, Convert.ToDouble(frame["mean"][row], CultureInfo.InvariantCulture), stored[(0, 0)].Mean!.Value * 2e-6);
    }

    // The J exceedance curve: by default at most 100 thresholds (1 kW/m unless the largest J needs a coarser step of 2,
    // 5, 10 ... kW/m), j_step asks for its own step; at the thresholds both share the fractions are equal, and asking for
    // the curve leaves the period table unchanged.
    [Fact]
    public async Task PowerCurveDefaultsToAtMostAHundredThresholdsAndJStepAsksForAnother()
    {
        static (double Step, double[] Thresholds, double[] Fractions) Curve(JsonElement root)
        {
            var j = root.GetProperty("exceedance").GetProperty("j");
            return (j.GetProperty("step").GetDouble(), [.. j.GetProperty("thresholds").EnumerateArray().Select(t => t.GetDouble())],
                [.. j.GetProperty("fractions").EnumerateArray().Select(t => t.GetDouble())]);
        }
        var byDefault = JsonDocument.Parse(await _client.GetStringAsync($"{Point}?{At(5, 5)}&include=exceedance")).RootElement;
        var fine = JsonDocument.Parse(await _client.GetStringAsync($"{Point}?{At(5, 5)}&include=exceedance&j_step=1")).RootElement;
        var half = JsonDocument.Parse(await _client.GetStringAsync($"{Point}?{At(5, 5)}&include=exceedance&j_step=0.5")).RootElement;
        var none = JsonDocument.Parse(await _client.GetStringAsync($"{Point}?{At(5, 5)}&include=none")).RootElement;
        var (step, thresholds, fractions) = Curve(byDefault);
        Assert.True(thresholds.Length <= 100, $"{thresholds.Length} thresholds");
        Assert.Contains(step, new[] { 1.0, 2, 5, 10, 20, 50, 100 });
        var (fineStep, fineThresholds, fineFractions) = Curve(fine);
        Assert.Equal(1.0, fineStep);
        Assert.Equal(0.5, Curve(half).Step);
        for (var k = 0; k < thresholds.Length; k++)
        {
            var at = Array.FindIndex(fineThresholds, t => Math.Abs(t - thresholds[k]) < 1e-9);
            Assert.Equal(at < 0 ? 0 : fineFractions[at], fractions[k]);
        }
        Assert.Equal(none.GetProperty("periods").ToString(), byDefault.GetProperty("periods").ToString());
    }

    [Theory]
    [InlineData("lat=40.5&lon=20.5&j_step=0", "j_step")]
    [InlineData("lat=40.5&lon=20.5&j_step=fine", "j_step")]
    [InlineData("lat=abc&lon=20.5", "lat")]
    [InlineData("lat=91&lon=20.5", "lat")]
    [InlineData("lat=40.5&lon=-181", "lon")]
    [InlineData("lon=20.5", "lat")]
    [InlineData("lat=40.5&lon=20.5&period=winter", "period")]
    [InlineData("lat=40.5&lon=20.5&from=2020&to=2019", "to")]
    [InlineData("lat=40.5&lon=20.5&months=0,13", "months")]
    [InlineData("lat=40.5&lon=20.5&include=everything", "include")]
    [InlineData("lat=40.5&lon=20.5&format=xml", "format")]
    public async Task BadQueryValuesAreValidationProblemsNamingTheField(string query, string field)
    {
        var problem = await Problems.AssertAsync(await _client.GetAsync($"{Point}?{query}"), HttpStatusCode.BadRequest);
        Assert.True(problem.GetProperty("errors").TryGetProperty(field, out _), problem.ToString());
    }

    [Fact]
    public async Task PositionOutsideTheDatasetIsUnprocessable()
    {
        await Problems.AssertAsync(await _client.GetAsync($"{Point}?lat=45&lon=20.5"), HttpStatusCode.UnprocessableEntity, "outside dataset");
        await Problems.AssertAsync(await _client.GetAsync($"/api/v1/datasets/nowhere/point?lat=40.5&lon=20.5"), HttpStatusCode.NotFound);
    }

    [Fact]
    public async Task PositionOnLandBeyondTheDistanceLimitIsUnprocessable()
    {
        await using var strict = atlas.Create(new Dictionary<string, string?> { ["AtlasApiOptions:PointMaxDistanceKm"] = "5" });
        // lon 21.05 lies between the two dry columns, about 12.7 km east of the last wet column.
        var response = await strict.CreateClient().GetAsync($"{Point}?lat=40.45&lon=21.05");
        await Problems.AssertAsync(response, HttpStatusCode.UnprocessableEntity, "the limit is 5 km");
    }

    [Fact]
    public async Task SeriesCsvStreamsEveryStepWithDecodedValues()
    {
        var url = $"{Point}/series?{At(3, 7)}&from=2020&to=2020";
        var download = await CsvDownloadCheck.AssertAsync(_client, url);
        Assert.Contains(AtlasCaution.Text, CsvDownloadCheck.Notes(download.Metadata));
        Assert.Equal("m", CsvDownloadCheck.Unit(download.Metadata, "hs"));
        Assert.Equal("kW/m", CsvDownloadCheck.Unit(download.Metadata, "j"));
        var rows = download.Csv.Split("\r\n", StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal("time,hs,te,tp,dir,spread,j", rows[0]);
        Assert.Equal(SyntheticAtlas.Timeline(2020).Length, rows.Length - 1);
        var cell = new Atlas.Storage.Cells.CellRecord(SyntheticAtlas.CellId(3, 7), 3, 7, 0, 0, null, true);
        var chunk = SyntheticAtlas.Chunk(cell, 2020);
        var hs = new float[SyntheticAtlas.Timeline(2020).Length];
        Atlas.Storage.Series.SeriesCodec.Decode(chunk, WaveParameter.Hs, hs);
        Assert.Equal("2020-01-01T00:00:00Z,,", rows[1][..22]);  // step 0 of column 3 is missing
        var second = rows[2].Split(',');
        Assert.Equal("2020-01-01T03:00:00Z", second[0]);
        Assert.Equal(hs[1], float.Parse(second[1], CultureInfo.InvariantCulture), 5e-4);
    }

    [Fact]
    public async Task SeriesJsonHasNullForMissingStepsAndRangeLimitIsEnforced()
    {
        var root = JsonDocument.Parse(await _client.GetStringAsync($"{Point}/series?{At(3, 7)}&from=2019&to=2019&format=json")).RootElement;
        var steps = root.GetProperty("steps");
        Assert.Equal(SyntheticAtlas.Timeline(2019).Length, steps.GetArrayLength());
        Assert.Equal(JsonValueKind.Null, steps[0].GetProperty("hs").ValueKind);
        Assert.True(steps[1].GetProperty("j").GetDouble() > 0);
        await using var strict = atlas.Create(new Dictionary<string, string?> { ["AtlasApiOptions:SeriesMaxYearsPerRequest"] = "1" });
        await Problems.AssertAsync(await strict.CreateClient().GetAsync($"{Point}/series?{At(3, 7)}"), HttpStatusCode.UnprocessableEntity, "at most 1");
        await Problems.AssertAsync(await _client.GetAsync($"{Point}/series?{At(3, 7)}&from=2021&to=2019"), HttpStatusCode.BadRequest, "reversed");
    }
}
