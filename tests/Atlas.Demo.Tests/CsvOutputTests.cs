using System.Globalization;
using System.Text.Json;

namespace Atlas.Demo.Tests;

[Collection(WrittenScenarioCollection.Name)]
public class CsvOutputTests(WrittenScenarioFixture written)
{
    private static readonly string[] BuoyColumns = ["time", "hs_m", "tp_s", "te_s", "dir_deg", "qc"];

    [Fact]
    public void BuoyRecordsParseWithPythonsCsvModuleWithGapsAndFlaggedRows()
    {
        var options = WrittenScenarioFixture.Options;
        int slots = (int)(options.End - options.Start).TotalHours;
        foreach (var buoy in written.Output.Scenario.Buoys)
        {
            using var doc = JsonDocument.Parse(ExternalProcess.RunPythonScript("check_csv.py", "buoy", written.PathOf(buoy.FileName)));
            var r = doc.RootElement;
            Assert.Equal(BuoyColumns, r.GetProperty("header").EnumerateArray().Select(e => e.GetString()));
            // Hourly rows (datetime.strptime with a trailing Z), some absent in outages.
            Assert.Equal(1.0, r.GetProperty("min_step_h").GetDouble());
            int rows = r.GetProperty("rows").GetInt32();
            Assert.InRange(rows, slots - BuoyRecordSimulator.GapCount * (slots / 40), slots - 1);
            Assert.InRange(r.GetProperty("gaps").GetInt32(), 1, BuoyRecordSimulator.GapCount);
            var qc = r.GetProperty("qc_counts");
            Assert.Equal(BuoyRecordSimulator.SpikeCount, qc.GetProperty("1").GetInt32());
            Assert.Equal(BuoyRecordSimulator.DropoutCount, qc.GetProperty("2").GetInt32());
            Assert.Equal(rows - BuoyRecordSimulator.SpikeCount - BuoyRecordSimulator.DropoutCount, qc.GetProperty("0").GetInt32());
            // Dropouts carry no values; good rows always do.
            Assert.Equal(BuoyRecordSimulator.DropoutCount, r.GetProperty("flagged_empty").GetInt32());
            Assert.Equal(0, r.GetProperty("good_empty").GetInt32());
            Assert.InRange(r.GetProperty("dir_min").GetDouble(), 0.0, 360.0);
            Assert.InRange(r.GetProperty("dir_max").GetDouble(), 0.0, 359.95);
            Assert.InRange(r.GetProperty("te_over_tp_median").GetDouble(), 0.7, 1.0);
            Assert.InRange(r.GetProperty("hs_max").GetDouble(), 1.0, 15.0);
        }
    }

    [Fact]
    public void PowerMatrixParsesWithNumpyAndHasAPlausibleShape()
    {
        var device = written.Output.Scenario.Device;
        using var doc = JsonDocument.Parse(ExternalProcess.RunPythonScript("check_csv.py", "matrix", written.PathOf(device.FileName)));
        var r = doc.RootElement;
        Assert.Equal("hs_m\\te_s", r.GetProperty("corner").GetString());
        Assert.Equal(Enumerable.Range(0, 13).Select(i => 4.5 + i), r.GetProperty("te").EnumerateArray().Select(e => e.GetDouble()));
        Assert.Equal(Enumerable.Range(0, 14).Select(i => 0.25 + 0.5 * i), r.GetProperty("hs").EnumerateArray().Select(e => e.GetDouble()));
        double[][] power = [.. r.GetProperty("power").EnumerateArray().Select(row => row.EnumerateArray().Select(e => e.GetDouble()).ToArray())];
        Assert.All(power, row => Assert.All(row, p => Assert.InRange(p, 0.0, device.RatedKilowatts)));
        Assert.Equal(device.RatedKilowatts, power.Max(row => row.Max()));
        // Rises with Hs in every Te column.
        for (int j = 0; j < 13; j++)
            for (int i = 1; i < 14; i++)
                Assert.True(power[i][j] >= power[i - 1][j], $"Te column {j}, Hs row {i}");
        // Below the rating power follows wave power, proportional to Hs^2 (IEC TS 62600-101,
        // from memory): Hs from 0.75 to 1.25 m at Te = 9.5 s gives (5/3)^2 = 2.78 times, within 5 % (kW rounding and the
        // onset of the rating).
        Assert.Equal(25.0 / 9.0, power[2][5] / power[1][5], 0.14);
        // Peaks near resonance and falls off at short and long periods (Hs = 2.25 m row).
        double[] row = power[4];
        int best = Array.IndexOf(row, row.Max());
        Assert.InRange(4.5 + best, 7.5, 10.5);
        Assert.True(row[0] < 0.4 * row[best] && row[12] < 0.4 * row[best]);
    }

    [Fact]
    public void StationListNamesOneCalibrationAndOneValidationBuoyAtWetCells()
    {
        using var doc = JsonDocument.Parse(ExternalProcess.RunPythonScript("check_csv.py", "stations", written.PathOf(DemoScenario.StationListFileName)));
        var stations = doc.RootElement.EnumerateArray().ToArray();
        Assert.Equal(2, stations.Length);
        Assert.Equal(["calibration", "validation"], stations.Select(s => s.GetProperty("role").GetString()).Order());
        var grid = written.Grid;
        foreach (var s in stations)
        {
            double lat = double.Parse(s.GetProperty("lat").GetString()!, CultureInfo.InvariantCulture);
            double lon = double.Parse(s.GetProperty("lon").GetString()!, CultureInfo.InvariantCulture);
            double depth = double.Parse(s.GetProperty("depth_m").GetString()!, CultureInfo.InvariantCulture);
            int k = grid.NearestWetCell(lat, lon);
            Assert.Equal(grid.LatitudeOf(k), lat, 1e-4);
            Assert.Equal(grid.LongitudeOf(k), lon, 1e-4);
            Assert.Equal(grid.DepthMetres[k], depth, 0.05);
            Assert.InRange(depth, 10.0, 80.0);
            Assert.True(File.Exists(written.PathOf(s.GetProperty("file").GetString()!)));
            Assert.False(string.IsNullOrWhiteSpace(s.GetProperty("instrument").GetString()));
        }

        // The JSON manifest says the same, and that the data are synthetic.
        using var manifest = JsonDocument.Parse(File.ReadAllText(written.PathOf(DemoScenario.ManifestFileName)));
        var m = manifest.RootElement;
        Assert.Equal("Skelvane Reach", m.GetProperty("name").GetString());
        Assert.Contains("not real data", m.GetProperty("summary").GetString());
        Assert.Equal(2, m.GetProperty("stations").GetArrayLength());
        Assert.Equal(written.Output.Scenario.FieldFiles, m.GetProperty("field_files").EnumerateArray().Select(e => e.GetString()));
    }
}
