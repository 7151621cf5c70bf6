using System.Diagnostics;
using Atlas.Storage;

namespace Atlas.Ingest.Tests.Assessment;

/// <summary>
/// Station and device files for the loading tests: the hand-made files of tests/data/assessment, CSV variants written
/// here, and CF-NetCDF point time series written by netCDF4-python (make_station_netcdf.py, a writer the project did
/// not write).
/// </summary>
public static class StationFixtures
{
    public static string Checkout { get; } = AtlasHome.FindCheckout(AppContext.BaseDirectory)!;

    public static string Folder { get; } = Directory.CreateTempSubdirectory("atlas-station-tests-").FullName;

    /// <summary>A file of tests/data/assessment.</summary>
    public static string Data(string name) => Path.Combine(Checkout, "tests", "data", "assessment", name);

    /// <summary>Writes <paramref name="text"/> to a new file named <paramref name="name"/> and returns its path.</summary>
    public static string Write(string name, string text)
    {
        var path = Path.Combine(Folder, name);
        File.WriteAllText(path, text);
        return path;
    }

    /// <summary>A NetCDF station file of one of the cases of make_station_netcdf.py.</summary>
    public static string NetCdf(string testCase)
    {
        var path = Path.Combine(Folder, $"station-{testCase}-{Guid.NewGuid():N}.nc");
        var script = Path.Combine(Checkout, "tests", "Atlas.Ingest.Tests", "Assessment", "make_station_netcdf.py");
        var start = new ProcessStartInfo("/usr/bin/python3") { RedirectStandardError = true, UseShellExecute = false };
        start.ArgumentList.Add(script);
        start.ArgumentList.Add(path);
        start.ArgumentList.Add(testCase);
        using var process = Process.Start(start)!;
        var error = process.StandardError.ReadToEnd();
        process.WaitForExit();
        if (process.ExitCode != 0) throw new InvalidOperationException($"make_station_netcdf.py {testCase} failed: {error}");
        return path;
    }
}
