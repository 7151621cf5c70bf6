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
    // snake_case member names, written in declaration order and indented, as the manifest has always been laid out.
    private static readonly JsonSerializerOptions ManifestJson = new()
    {
        PropertyNamingPolicy = JsonNamingPolicy.SnakeCaseLower,
        WriteIndented = true,
    };

    private static readonly Dictionary<string, string> QcCodes = new()
    {
        ["0"] = "good",
        ["1"] = "suspect: spike",
        ["2"] = "bad: dropout, no values",
    };

    /// <summary>Writes <c>scenario.json</c> for <paramref name="scenario"/> to <paramref name="path"/>.</summary>
    public static void WriteManifest(string path, DemoScenario scenario)
    {
        ArgumentNullException.ThrowIfNull(scenario);
        var b = scenario.Bounds;
        var manifest = new Manifest(
            scenario.Name,
            scenario.Summary,
            scenario.Features,
            new ManifestBounds(b.West, b.East, b.South, b.North),
            new ManifestGrid(scenario.Columns, scenario.Rows, scenario.WetCells, scenario.MinimumDepthMetres, scenario.MaximumDepthMetres),
            new ManifestTime(Iso(scenario.Start), Iso(scenario.End), scenario.StepHours, scenario.Years),
            scenario.Seed,
            scenario.FieldFiles,
            [.. scenario.Buoys.Select(u => new ManifestStation(u.Name, u.FileName, RoleName(u.Role), u.Instrument, u.Latitude, u.Longitude,
                u.DepthMetres, u.HsBiasFraction, u.IntervalMinutes))],
            QcCodes,
            new ManifestDevice(scenario.Device.Name, scenario.Device.Kind, scenario.Device.RatedKilowatts, scenario.Device.FileName));
        using var stream = File.Create(path);
        JsonSerializer.Serialize(stream, manifest, ManifestJson);
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

    private sealed record Manifest(
        string Name, string Summary, IReadOnlyList<string> Features, ManifestBounds Bounds, ManifestGrid Grid, ManifestTime Time,
        ulong Seed, IReadOnlyList<string> FieldFiles, IReadOnlyList<ManifestStation> Stations, IReadOnlyDictionary<string, string> QcCodes,
        ManifestDevice Device);

    private sealed record ManifestBounds(double West, double East, double South, double North);

    private sealed record ManifestGrid(int Columns, int Rows, int WetCells, double MinDepthM, double MaxDepthM);

    private sealed record ManifestTime(string Start, string End, int StepHours, IReadOnlyList<int> Years);

    private sealed record ManifestStation(
        string Name, string File, string Role, string Instrument, double Lat, double Lon, double DepthM, double HsBiasFraction, int IntervalMin);

    private sealed record ManifestDevice(string Name, string Kind, double RatedKw, string File);
}
