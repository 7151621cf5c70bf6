using System.Text.Json;
using Atlas.Api.Infrastructure;
using Atlas.Api.Tests.Support;
using Atlas.Ingest.Ingestion;
using Atlas.TestSupport;
using Microsoft.AspNetCore.Hosting;
using Microsoft.AspNetCore.Mvc.Testing;

namespace Atlas.Api.Tests;

/// <summary>
/// Spectral output points in the point answers: a dataset of points loaded from spectra written by netCDF4-python
/// (tests/data/ingest/make_point_spectra.py) beside a gridded dataset of the same invented hindcast (make_fixture.py), in
/// a database of their own. Expected values come from the script's NumPy/SciPy integration of every step.
/// </summary>
public sealed class OutputPointApiTests : IAsyncLifetime
{
    private readonly TestDatabase _database = new();
    private WebApplicationFactory<Program> _factory = null!;
    private string _points = "";

    public async Task InitializeAsync()
    {
        await _database.InitializeAsync();
        var folder = Directory.CreateTempSubdirectory("atlas-output-points-").FullName;
        var grid = NetCdf4PythonFixture.Make(Path.Combine(folder, "grid.nc"), 0, 16);
        _points = PointSpectraFixture.Make(Path.Combine(folder, "points.nc"), 0, 16);
        var ingest = new HindcastIngestor(_database.DataSource);
        await ingest.RunAsync(new IngestRequest("grid", [grid]));
        await ingest.RunAsync(new IngestRequest("points", [_points]) { GridDataset = "grid" });
        await new Atlas.Ingest.Statistics.StatisticsService(_database.DataSource).RunAsync("points", all: false);
        _factory = new WebApplicationFactory<Program>().WithWebHostBuilder(host =>
        {
            host.UseEnvironment("Production");
            host.UseSetting("ConnectionStrings:Atlas", _database.ConnectionString);
            host.UseSetting("AtlasApiOptions:WebRootPath", folder);
            host.UseSetting("AtlasApiOptions:ExpensiveRequestsPerMinute", "100000");
        });
    }

    public async Task DisposeAsync()
    {
        await _factory.DisposeAsync();
        await _database.DisposeAsync();
    }

    private static JsonElement Period(JsonElement periods, string name) =>
        periods.EnumerateArray().Single(p => p.GetProperty("period").GetString() == name);

    [Fact]
    public async Task AnOutputPointAnswersWithTheSpectralPowerAndDirectionality()
    {
        var client = _factory.CreateClient();
        var root = JsonDocument.Parse(await client.GetStringAsync("/api/v1/datasets/points/point?lat=50.21&lon=-19.71&include=spectra")).RootElement;
        Assert.Equal("spectra", root.GetProperty("power_from").GetString());
        var steps = PointSpectraFixture.Expected(_points)["steps"]!.AsArray().Select(s => s![1]!).ToList();
        // All 16 steps lie in January: the annual means are plain means of the script's per-step values.
        double meanJ = steps.Average(s => s["j"]!.GetValue<double>());
        double meanParametric = steps.Average(s => s["j_parametric"]!.GetValue<double>());
        var annual = Period(root.GetProperty("periods"), "annual");
        Assert.Equal(meanJ, annual.GetProperty("j").GetProperty("mean").GetDouble(), 1e-5 * meanJ);
        var spectral = root.GetProperty("spectral");
        Assert.Equal("Cobble Shelf", spectral.GetProperty("station").GetString());
        Assert.Equal(JsonValueKind.Null, spectral.GetProperty("distance_km").ValueKind);
        var annualSpectral = Period(spectral.GetProperty("periods"), "annual");
        Assert.Equal(meanParametric, annualSpectral.GetProperty("mean_power_parametric").GetDouble(), 1e-5 * meanParametric);
        Assert.True(annualSpectral.GetProperty("parametric_over_spectral").GetDouble() > 1.0);

        // The period directionality from the period-mean J_theta: the script's direction-bin powers, averaged over the
        // steps and maximised here on a 0.01-degree grid (IEC TS 62600-101 definition; the grid maximum is at most 1e-7
        // below the true one for this smooth J_theta).
        var meanPowers = Enumerable.Range(0, 24).Select(j => steps.Average(s => s["direction_powers"]!.AsArray()[j]!.GetValue<double>())).ToArray();
        var directionsFrom = Enumerable.Range(0, 24).Select(j => ((90.0 - 15.0 * j) % 360 + 360 + 180) % 360).ToArray();
        double best = 0;
        for (int k = 0; k < 36000; k++)
        {
            double theta = k * 0.01 * Math.PI / 180, sum = 0;
            for (int j = 0; j < 24; j++) sum += meanPowers[j] * Math.Max(0, Math.Cos(theta - directionsFrom[j] * Math.PI / 180));
            best = Math.Max(best, sum);
        }
        double expectedD = best / meanPowers.Sum();
        Assert.Equal(expectedD, annual.GetProperty("direction").GetProperty("directionality_coefficient").GetDouble(), 2e-6);
        Assert.Equal(expectedD, annualSpectral.GetProperty("directionality_coefficient").GetDouble(), 2e-6);
        Assert.Equal(32, annualSpectral.GetProperty("frequency_spectrum").GetArrayLength());
        Assert.Equal(24, annualSpectral.GetProperty("direction_power").GetArrayLength());
    }

    // include=none leaves the period-mean spectra and direction powers (chart data) out of the spectral block and keeps
    // its period summaries, the same numbers as the answer with every part.
    [Fact]
    public async Task SummariesAloneLeaveTheSpectraOutOfTheSpectralBlock()
    {
        var client = _factory.CreateClient();
        foreach (var at in new[] { "points/point?lat=50.21&lon=-19.71", "grid/point?lat=50.2&lon=-19.8" })
        {
            var all = JsonDocument.Parse(await client.GetStringAsync($"/api/v1/datasets/{at}")).RootElement.GetProperty("spectral");
            var none = JsonDocument.Parse(await client.GetStringAsync($"/api/v1/datasets/{at}&include=none")).RootElement.GetProperty("spectral");
            Assert.True(all.TryGetProperty("frequencies_hz", out _), at);
            Assert.True(all.TryGetProperty("directions_from_deg", out _), at);
            Assert.False(none.TryGetProperty("frequencies_hz", out _), at);
            Assert.False(none.TryGetProperty("directions_from_deg", out _), at);
            var summaries = new[] { "steps", "mean_power_spectral", "mean_power_parametric", "parametric_over_spectral", "directionality_coefficient",
                "max_power_from_deg", "mean_spectral_width" };
            foreach (var period in all.GetProperty("periods").EnumerateArray())
            {
                var name = period.GetProperty("period").GetString()!;
                var bare = Period(none.GetProperty("periods"), name);
                Assert.True(period.GetProperty("frequency_spectrum").GetArrayLength() > 0, $"{at} {name}");
                Assert.False(bare.TryGetProperty("frequency_spectrum", out _), $"{at} {name}");
                Assert.False(bare.TryGetProperty("direction_power", out _), $"{at} {name}");
                foreach (var key in summaries)
                    Assert.Equal(period.GetProperty(key).GetRawText(), bare.GetProperty(key).GetRawText());
            }
        }
    }

    // The statistics pass of output points stores the period directionality from the spectra: the d layer (CSV, read as
    // plain text) equals the point answer's, which the test above holds against the NumPy script's direction powers.
    [Fact]
    public async Task TheDirectionalityLayerOfOutputPointsComesFromTheSpectra()
    {
        await new Atlas.Ingest.Statistics.StatisticsService(_database.DataSource).RunAsync("points", all: true);
        var client = _factory.CreateClient();
        var text = await client.GetStringAsync("/api/v1/datasets/points/layers/d/mean/annual.csv");
        var csv = text.Split('\n').Select(l => l.TrimEnd('\r')).Where(l => l.Length > 0).ToArray();
        Assert.True(csv.Length == 4, text);
        var header = csv[0].Split(',');
        var valueColumn = Array.IndexOf(header, "value");
        var lonColumn = Array.IndexOf(header, "lon");
        var row = csv.Skip(1).Select(l => l.Split(',')).Single(c => Math.Abs(double.Parse(c[lonColumn], System.Globalization.CultureInfo.InvariantCulture) + 19.71) < 0.001);
        var root = JsonDocument.Parse(await client.GetStringAsync("/api/v1/datasets/points/point?lat=50.21&lon=-19.71&include=none")).RootElement;
        double expected = Period(root.GetProperty("periods"), "annual").GetProperty("direction").GetProperty("directionality_coefficient").GetDouble();
        Assert.Equal(expected, double.Parse(row[valueColumn], System.Globalization.CultureInfo.InvariantCulture), 1e-6);
    }

    [Fact]
    public async Task TheGriddedDatasetAddsTheNearestOutputPointAndItsDistance()
    {
        var client = _factory.CreateClient();
        var root = JsonDocument.Parse(await client.GetStringAsync("/api/v1/datasets/grid/point?lat=50.3&lon=-19.6&include=none")).RootElement;
        Assert.Equal("Hs and Te", root.GetProperty("power_from").GetString());
        var spectral = root.GetProperty("spectral");
        Assert.Equal("points", spectral.GetProperty("dataset").GetString());
        Assert.Equal("Wick Inner", spectral.GetProperty("station").GetString());
        // 50.33 N 19.58 W from 50.3 N 19.6 W: about 3.6 km (spherical estimate: dlat 0.03 deg = 3.34 km, dlon 0.02 deg x
        // cos 50.3 deg = 1.42 km; common practice for a check of order).
        Assert.InRange(spectral.GetProperty("distance_km").GetDouble(), 3.4, 3.9);
    }

    // The site report of a gridded cell prints the nearest output point's spectral values, read back by poppler's pdftotext
    // (an outside reader): the same station and the same annual means as the point answer's JSON, at the printed precision.
    // The output points beside a gridded dataset are found from the catalogue kept in memory until its stamp moves: points
    // loaded after the server started join the gridded answers, and leave them when removed, without a restart (the
    // answer asked for again as the stamp is read afresh, a couple of seconds at most).
    [Fact]
    public async Task OutputPointsLoadedOrRemovedLaterJoinOrLeaveTheGriddedAnswers()
    {
        var client = _factory.CreateClient();
        var folder = Path.GetDirectoryName(_points)!;
        await new HindcastIngestor(_database.DataSource).RunAsync(new IngestRequest("grid-later", [Path.Combine(folder, "grid.nc")]));
        const string url = "/api/v1/datasets/grid-later/point?lat=50.3&lon=-19.6&include=none";
        static async Task<JsonElement> SpectralAsync(HttpClient client) =>
            JsonDocument.Parse(await client.GetStringAsync(url)).RootElement.GetProperty("spectral");
        Assert.Equal(JsonValueKind.Null, (await SpectralAsync(client)).ValueKind);

        await new HindcastIngestor(_database.DataSource).RunAsync(new IngestRequest("points-later", [_points]) { GridDataset = "grid-later" });
        var joined = await Patience.UntilAsync(() => SpectralAsync(client), s => s.ValueKind == JsonValueKind.Object, "the new output points in the answer");
        Assert.Equal("points-later", joined.GetProperty("dataset").GetString());

        await new Atlas.Storage.Datasets.DatasetStore(_database.DataSource).DeleteAsync("points-later");
        await Patience.UntilAsync(() => SpectralAsync(client), s => s.ValueKind == JsonValueKind.Null, "the removed output points gone from the answer");
    }

    [Fact]
    public async Task TheSiteReportPrintsTheNearestOutputPointsSpectralValues()
    {
        var client = _factory.CreateClient();
        const string at = "lat=50.3&lon=-19.6";
        var answer = JsonDocument.Parse(await client.GetStringAsync($"/api/v1/datasets/grid/point?{at}&include=none")).RootElement;
        var response = await client.GetAsync($"/api/v1/datasets/grid/point/report.pdf?{at}");
        Assert.True(response.IsSuccessStatusCode, await response.Content.ReadAsStringAsync());
        var report = new PopplerReport(await response.Content.ReadAsByteArrayAsync(), "site-report-output-point");
        var text = report.Flat();
        Assert.Contains("Exact values from the spectra", text);
        Assert.Contains("Wick Inner", text);
        var annual = Period(answer.GetProperty("spectral").GetProperty("periods"), "annual");
        string Printed(string member, int decimals) => annual.GetProperty(member).GetDouble().ToString($"F{decimals}", System.Globalization.CultureInfo.InvariantCulture);
        Assert.Contains($"{Printed("mean_power_spectral", 1)} {Printed("mean_power_parametric", 1)}", text);
        Assert.Contains(Printed("directionality_coefficient", 3), text);
    }

    // The site report of an output point itself, read back by pdftotext: its own spectral values, not a neighbour's.
    [Fact]
    public async Task TheSiteReportOfAnOutputPointPrintsItsOwnSpectralValues()
    {
        var client = _factory.CreateClient();
        var response = await client.GetAsync("/api/v1/datasets/points/point/report.pdf?lat=50.21&lon=-19.71");
        Assert.True(response.IsSuccessStatusCode, await response.Content.ReadAsStringAsync());
        var text = new PopplerReport(await response.Content.ReadAsByteArrayAsync(), "site-report-at-output-point").Flat();
        Assert.Contains("This site is the output point Cobble Shelf", text);
        Assert.Contains("J integrated from the output point's spectrum at every step", text);
        var answer = JsonDocument.Parse(await client.GetStringAsync("/api/v1/datasets/points/point?lat=50.21&lon=-19.71&include=none")).RootElement;
        var annual = Period(answer.GetProperty("spectral").GetProperty("periods"), "annual");
        Assert.Contains(annual.GetProperty("mean_power_spectral").GetDouble().ToString("F1", System.Globalization.CultureInfo.InvariantCulture), text);
    }

    // The series at an output point: j is the power integrated from the spectra (the script's NumPy/SciPy values, to the
    // 3 decimals written), followed by the spectral values; the NetCDF form read back by netCDF4-python (a reader the project
    // did not write) holds the same numbers as the JSON form.
    [Fact]
    public async Task SeriesAtAnOutputPointCarryTheSpectralValuesInEveryFormat()
    {
        var client = _factory.CreateClient();
        const string query = "/api/v1/datasets/points/point/series?lat=50.21&lon=-19.71";
        // Plain RFC 4180 (CRLF line ends, no comment lines), read by GDAL's CSV driver and pandas with their defaults.
        var download = await CsvDownloadCheck.AssertAsync(client, query + "&format=csv");
        Assert.Equal("kW/m", CsvDownloadCheck.Unit(download.Metadata, "j"));
        Assert.Equal("1", CsvDownloadCheck.Unit(download.Metadata, "directionality"));
        var csv = download.Csv.Split("\r\n").Where(l => l.Length > 0).ToArray();
        Assert.Equal("time,hs,te,tp,dir,spread,j,j_parametric,directionality,max_power_from_deg,spectral_width", csv[0]);
        var steps = PointSpectraFixture.Expected(_points)["steps"]!.AsArray().Select(s => s![1]!).ToList();
        for (int t = 0; t < steps.Count; t++)
        {
            var cells = csv[t + 1].Split(',');
            Assert.Equal(steps[t]["j"]!.GetValue<double>(), double.Parse(cells[6], System.Globalization.CultureInfo.InvariantCulture), 0.0006);
            Assert.Equal(steps[t]["directionality"]!.GetValue<double>(), double.Parse(cells[8], System.Globalization.CultureInfo.InvariantCulture), 0.00006);
        }

        var json = JsonDocument.Parse(await client.GetStringAsync(query + "&format=json")).RootElement.GetProperty("steps");
        var nc = Path.Combine(Directory.CreateTempSubdirectory("atlas-series-nc-").FullName, "series.nc");
        await File.WriteAllBytesAsync(nc, await client.GetByteArrayAsync(query + "&format=nc"));
        var script = "import sys, json\nfrom netCDF4 import Dataset\nd = Dataset(sys.argv[1])\n" +
                     "print(json.dumps({'featureType': d.featureType, 'station': d['station_name'][:].tobytes().decode().strip(), " +
                     "'j': [float(v) for v in d['j'][:]], 'width': [float(v) for v in d['spectral_width'][:]], 'time0': float(d['time'][0])}))";
        var start = new System.Diagnostics.ProcessStartInfo("/usr/bin/python3") { RedirectStandardOutput = true, RedirectStandardError = true };
        start.ArgumentList.Add("-c"); start.ArgumentList.Add(script); start.ArgumentList.Add(nc);
        using var python = System.Diagnostics.Process.Start(start)!;
        var output = await python.StandardOutput.ReadToEndAsync();
        await python.WaitForExitAsync();
        Assert.True(python.ExitCode == 0, await python.StandardError.ReadToEndAsync());
        var read = JsonDocument.Parse(output).RootElement;
        Assert.Equal("timeSeries", read.GetProperty("featureType").GetString());
        Assert.Equal("Cobble Shelf", read.GetProperty("station").GetString());
        Assert.Equal(new DateTimeOffset(2021, 1, 1, 0, 0, 0, TimeSpan.Zero).ToUnixTimeSeconds(), read.GetProperty("time0").GetDouble());
        var j = read.GetProperty("j").EnumerateArray().Select(v => v.GetDouble()).ToArray();
        Assert.Equal(json.GetArrayLength(), j.Length);
        for (int t = 0; t < j.Length; t++) Assert.Equal(json[t].GetProperty("j").GetDouble(), j[t], 0.0006);
    }

    // The output points' layer downloads: the CSV is plain RFC 4180 with a station column (read by GDAL's CSV driver and
    // pandas with their defaults, its CSVW metadata found by the describedby link); the GeoJSON has one named point
    // feature per output point and its provenance as a foreign member; a raster form is refused with a problem answer.
    [Fact]
    public async Task OutputPointLayersOpenAsTheyAreWithTheStationNames()
    {
        var client = _factory.CreateClient();
        const string stem = "/api/v1/datasets/points/layers/hs/mean/annual";
        var csv = await CsvDownloadCheck.AssertAsync(client, stem + ".csv");
        Assert.Equal(["cell_id", "station", "lon", "lat", "value"], csv.Header);
        Assert.Equal(3, csv.Rows);
        Assert.Equal("m", CsvDownloadCheck.Unit(csv.Metadata, "value"));
        var names = csv.Csv.Split("\r\n").Skip(1).Where(l => l.Length > 0).Select(l => l.Split(',')[1]).ToArray();
        Assert.Equal(["Harrow Deep", "Cobble Shelf", "Wick Inner"], names);

        var geojson = JsonDocument.Parse(await client.GetStringAsync(stem + ".geojson")).RootElement;
        Assert.Equal("output points", geojson.GetProperty("layer").GetProperty("geometry").GetString());
        Assert.True(geojson.TryGetProperty("provenance", out _));
        var features = geojson.GetProperty("features").EnumerateArray().ToArray();
        Assert.Equal(names, features.Select(f => f.GetProperty("properties").GetProperty("station").GetString()).ToArray());
        Assert.All(features, f => Assert.Equal("Point", f.GetProperty("geometry").GetProperty("type").GetString()));

        var png = await client.GetAsync(stem + ".png");
        Assert.Equal(System.Net.HttpStatusCode.UnprocessableEntity, png.StatusCode);
    }
}
