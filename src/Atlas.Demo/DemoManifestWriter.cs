using System.Globalization;
using System.Text;
using System.Text.Json;

namespace Atlas.Demo;

/// <summary>
/// Writes the scenario manifest (<c>scenario.json</c>: place, grid, period, files, stations with
/// their roles, device, quality codes) and the plain station list (<c>stations.csv</c>:
/// <c>name,file,lat,lon,depth_m,instrument,role,hs_bias_fraction,interval_min</c>). Neither holds
/// a time stamp of the run, so the same seed writes the same bytes.
/// </summary>
public static class DemoManifestWriter
{
    /// <summary>Writes <c>scenario.json</c> for <paramref name="scenario"/> to <paramref name="path"/>.</summary>
    public static void WriteManifest(string path, DemoScenario scenario)
    {
        ArgumentNullException.ThrowIfNull(scenario);
        using var stream = File.Create(path);
        using var json = new Utf8JsonWriter(stream, new JsonWriterOptions { Indented = true });
        json.WriteStartObject();
        json.WriteString("name", scenario.Name);
        json.WriteString("summary", scenario.Summary);
        json.WriteStartArray("features");
        foreach (var f in scenario.Features) json.WriteStringValue(f);
        json.WriteEndArray();
        json.WriteStartObject("bounds");
        json.WriteNumber("west", scenario.Bounds.West);
        json.WriteNumber("east", scenario.Bounds.East);
        json.WriteNumber("south", scenario.Bounds.South);
        json.WriteNumber("north", scenario.Bounds.North);
        json.WriteEndObject();
        json.WriteStartObject("grid");
        json.WriteNumber("columns", scenario.Columns);
        json.WriteNumber("rows", scenario.Rows);
        json.WriteNumber("wet_cells", scenario.WetCells);
        json.WriteNumber("min_depth_m", scenario.MinimumDepthMetres);
        json.WriteNumber("max_depth_m", scenario.MaximumDepthMetres);
        json.WriteEndObject();
        json.WriteStartObject("time");
        json.WriteString("start", Iso(scenario.Start));
        json.WriteString("end", Iso(scenario.End));
        json.WriteNumber("step_hours", scenario.StepHours);
        json.WriteStartArray("years");
        foreach (int y in scenario.Years) json.WriteNumberValue(y);
        json.WriteEndArray();
        json.WriteEndObject();
        json.WriteNumber("seed", scenario.Seed);
        json.WriteStartArray("field_files");
        foreach (var f in scenario.FieldFiles) json.WriteStringValue(f);
        json.WriteEndArray();
        json.WriteStartArray("stations");
        foreach (var b in scenario.Buoys)
        {
            json.WriteStartObject();
            json.WriteString("name", b.Name);
            json.WriteString("file", b.FileName);
            json.WriteString("role", RoleName(b.Role));
            json.WriteString("instrument", b.Instrument);
            json.WriteNumber("lat", b.Latitude);
            json.WriteNumber("lon", b.Longitude);
            json.WriteNumber("depth_m", b.DepthMetres);
            json.WriteNumber("hs_bias_fraction", b.HsBiasFraction);
            json.WriteNumber("interval_min", b.IntervalMinutes);
            json.WriteEndObject();
        }
        json.WriteEndArray();
        json.WriteStartObject("qc_codes");
        json.WriteString("0", "good");
        json.WriteString("1", "suspect: spike");
        json.WriteString("2", "bad: dropout, no values");
        json.WriteEndObject();
        json.WriteStartObject("device");
        json.WriteString("name", scenario.Device.Name);
        json.WriteString("kind", scenario.Device.Kind);
        json.WriteNumber("rated_kw", scenario.Device.RatedKilowatts);
        json.WriteString("file", scenario.Device.FileName);
        json.WriteEndObject();
        json.WriteEndObject();
    }

    /// <summary>Writes <c>stations.csv</c> for <paramref name="scenario"/> to <paramref name="path"/>.</summary>
    public static void WriteStationList(string path, DemoScenario scenario)
    {
        ArgumentNullException.ThrowIfNull(scenario);
        var c = CultureInfo.InvariantCulture;
        using var writer = new StreamWriter(path, append: false, new UTF8Encoding(false));
        writer.NewLine = "\n";
        writer.WriteLine("name,file,lat,lon,depth_m,instrument,role,hs_bias_fraction,interval_min");
        foreach (var b in scenario.Buoys)
            writer.WriteLine(string.Create(c,
                $"{b.Name},{b.FileName},{b.Latitude:F4},{b.Longitude:F4},{b.DepthMetres:F1},{b.Instrument.Replace(',', ';')},{RoleName(b.Role)},{b.HsBiasFraction:F2},{b.IntervalMinutes}"));
    }

    private static string RoleName(BuoyRole role) => role == BuoyRole.Calibration ? "calibration" : "validation";

    private static string Iso(DateTime utc) => utc.ToString("yyyy-MM-dd'T'HH:mm:ss'Z'", CultureInfo.InvariantCulture);
}
