using System.Text.Json;
using System.Text.RegularExpressions;
using Atlas.TestSupport;

namespace Atlas.Hindcast.Tests;

/// <summary>
/// Generates the test files once per run into a temporary folder, with tools the project did not write:
/// ncgen compiles the CDL sources of tests/data/netcdf in the formats each test needs, and netCDF4-python
/// (Debian's /usr/bin/python3) writes the compressed, packed NetCDF-4 fixture. netCDF4-python also reads every
/// generated file back (read_back.py), giving the reference values the decoded values are checked against.
/// One instance serves the whole test run (<see cref="Shared"/>), so test classes can run in parallel; its folder is
/// removed when the test process exits.
/// </summary>
public sealed partial class NetCdfFixtures : IDisposable
{
    private static readonly Lazy<NetCdfFixtures> Instance = new(() =>
    {
        var fixtures = new NetCdfFixtures();
        AppDomain.CurrentDomain.ProcessExit += (_, _) => fixtures.Dispose();
        return fixtures;
    });

    public static NetCdfFixtures Shared => Instance.Value;

    /// <summary>ncgen -k names of the formats, by the short name used in fixture names.</summary>
    public static readonly IReadOnlyDictionary<string, string> Kinds = new Dictionary<string, string>
    {
        ["classic"] = "classic",
        ["offset64"] = "64-bit offset",
        ["cdf5"] = "cdf5",
        ["nc4"] = "netCDF-4",
        ["nc4classic"] = "netCDF-4 classic model",
    };

    private static readonly (string Cdl, string[] Kinds)[] Builds =
    [
        ("regular_float", ["classic", "offset64", "cdf5", "nc4", "nc4classic"]),
        ("packed", ["classic", "nc4"]),
        ("units_to_direction", ["offset64"]),
        ("calendar_noleap", ["classic"]),
        ("calendar_all_leap", ["classic"]),
        ("calendar_360_day", ["classic"]),
        ("time_nonmonotonic", ["classic"]),
        ("time_duplicate", ["classic"]),
        ("missing_hs", ["classic"]),
        ("tm01_only", ["classic"]),
        ("curvilinear", ["cdf5"]),
        ("projected", ["nc4"]),
        ("projected_without_latlon", ["classic"]),
        ("ugrid_mesh", ["nc4classic"]),
        ("regular_shifted", ["classic"]),
        ("regular_auxiliary", ["classic"]),
        ("depth_with_time", ["classic"]),
        ("mapped_names", ["classic"]),
    ];

    private readonly Lazy<JsonDocument> _readBack;
    private readonly List<string> _generated = [];

    private NetCdfFixtures()
    {
        Directory = System.IO.Path.Combine(System.IO.Path.GetTempPath(), "atlas-hindcast-tests-" + Guid.NewGuid().ToString("N")[..12]);
        System.IO.Directory.CreateDirectory(Directory);
        var python = Task.Run(() => ExternalTool.Run(ExternalTool.Python, [Source("make_compressed.py"), Path("compressed"), CompressedSourceJson]));
        var builds = Builds.SelectMany(b => b.Kinds.Select(kind => (b.Cdl, Kind: kind))).ToList();
        Parallel.ForEach(builds, new ParallelOptions { MaxDegreeOfParallelism = 4 }, b => Compile(b.Cdl, b.Kind));
        _generated.AddRange(builds.Select(b => Path($"{b.Cdl}.{b.Kind}")));
        python.GetAwaiter().GetResult();
        _generated.Add(Path("compressed"));
        _readBack = new Lazy<JsonDocument>(() => JsonDocument.Parse(
            ExternalTool.Run(ExternalTool.Python, [Source("read_back.py"), .. _generated])));
    }

    public string Directory { get; }

    /// <summary>The values the python fixture script packed, before packing.</summary>
    public string CompressedSourceJson => System.IO.Path.Combine(Directory, "compressed.source.json");

    /// <summary>A tests/data/netcdf source file as copied next to the test assembly.</summary>
    public static string Source(string file) => System.IO.Path.Combine(AppContext.BaseDirectory, "netcdf", file);

    /// <summary>Path of a generated fixture, e.g. "regular_float.classic" or "compressed".</summary>
    public string Path(string name) => System.IO.Path.Combine(Directory, name + ".nc");

    /// <summary>A new path in the fixture folder for a file a test writes itself.</summary>
    public string Scratch(string name) => System.IO.Path.Combine(Directory, "scratch-" + Guid.NewGuid().ToString("N")[..8] + "-" + name);

    /// <summary>What netCDF4-python reads from a generated fixture (see read_back.py).</summary>
    public JsonElement ReadBack(string name) => _readBack.Value.RootElement.GetProperty(Path(name));

    /// <summary>netCDF4-python's values of one variable, masked values as NaN.</summary>
    public float[] ReferenceValues(string name, string variable) => Values(ReadBack(name).GetProperty("variables").GetProperty(variable));

    public static float[] Values(JsonElement variable) => variable.GetProperty("values").EnumerateArray()
        .Select(v => v.ValueKind == JsonValueKind.Null ? float.NaN : (float)v.GetDouble()).ToArray();

    public void Dispose()
    {
        if (_readBack.IsValueCreated) _readBack.Value.Dispose();
        try
        {
            System.IO.Directory.Delete(Directory, recursive: true);
        }
        catch (IOException)
        {
            // A scratch file still open elsewhere; the temp folder is cleaned by the system.
        }
    }

    private void Compile(string cdl, string kind)
    {
        string source = Source(cdl + ".cdl");
        if (kind is "classic" or "offset64" or "cdf5")
        {
            // ncgen refuses the NetCDF-4 storage attributes in the classic formats: drop those lines.
            string stripped = System.IO.Path.Combine(Directory, $"{cdl}.{kind}.cdl");
            File.WriteAllLines(stripped, File.ReadAllLines(source).Where(l => !StorageAttribute().IsMatch(l)));
            source = stripped;
        }
        ExternalTool.Run("ncgen", ["-k", Kinds[kind], "-o", Path($"{cdl}.{kind}"), source]);
    }

    [GeneratedRegex(@":_(DeflateLevel|Shuffle|ChunkSizes|Storage|Endianness)\s*=")]
    private static partial Regex StorageAttribute();
}
