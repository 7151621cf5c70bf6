using System.Text.Json;
using Atlas.Storage.Stations;

namespace Atlas.Cli.Demo;

/// <summary>A station of the demo manifest, with the path of its record file.</summary>
public sealed record DemoStationEntry(string Name, string FilePath, StationRole Role, string Instrument, double Latitude, double Longitude, double DepthMetres);

/// <summary>The device of the demo manifest, with the path of its power-matrix file.</summary>
public sealed record DemoDeviceEntry(string Name, string Kind, double RatedPowerKw, string FilePath);

/// <summary>
/// Reads the stations and the device that the demo generator listed in its manifest (<c>scenario.json</c> in the demo
/// folder), so that the registered buoys are exactly the files on disk.
/// </summary>
public static class DemoReferenceFiles
{
    /// <exception cref="FormatException">The manifest lacks a member or has one of the wrong kind (names it).</exception>
    public static (IReadOnlyList<DemoStationEntry> Stations, DemoDeviceEntry Device) Read(string folder, string manifestFileName)
    {
        var path = Path.Combine(folder, manifestFileName);
        using var document = JsonDocument.Parse(File.ReadAllBytes(path));
        var root = document.RootElement;
        var stations = new List<DemoStationEntry>();
        foreach (var s in Member(root, "stations", path).EnumerateArray())
        {
            var roleText = Text(s, "role", path);
            if (!StationStore.TryParseRole(roleText, out var role))
                throw new FormatException($"{path}: station role '{roleText}' is neither calibration nor validation");
            stations.Add(new DemoStationEntry(Text(s, "name", path), Path.Combine(folder, Text(s, "file", path)), role,
                Text(s, "instrument", path), Number(s, "lat", path), Number(s, "lon", path), Number(s, "depth_m", path)));
        }
        var d = Member(root, "device", path);
        var device = new DemoDeviceEntry(Text(d, "name", path), Text(d, "kind", path), Number(d, "rated_kw", path), Path.Combine(folder, Text(d, "file", path)));
        return (stations, device);
    }

    private static JsonElement Member(JsonElement element, string name, string path) =>
        element.ValueKind == JsonValueKind.Object && element.TryGetProperty(name, out var value)
            ? value
            : throw new FormatException($"{path}: the member '{name}' is missing");

    private static string Text(JsonElement element, string name, string path) =>
        Member(element, name, path) is { ValueKind: JsonValueKind.String } value ? value.GetString()! : throw new FormatException($"{path}: '{name}' is not a string");

    private static double Number(JsonElement element, string name, string path) =>
        Member(element, name, path) is { ValueKind: JsonValueKind.Number } value ? value.GetDouble() : throw new FormatException($"{path}: '{name}' is not a number");
}
