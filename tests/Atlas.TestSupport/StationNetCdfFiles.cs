using System.Diagnostics;
using Atlas.Storage;

namespace Atlas.TestSupport;

/// <summary>
/// CF-NetCDF station records (point time series) written by netCDF4-python with tests/data/assessment/make_station_netcdf.py,
/// a writer the project did not write, in Debian's /usr/bin/python3. The script's cases are listed in its docstring.
/// </summary>
public static class StationNetCdfFiles
{
    private static readonly string Script = Path.Combine(
        AtlasHome.FindCheckout(AppContext.BaseDirectory) ?? throw new InvalidOperationException("Atlas.sln not found above the test binaries."),
        "tests", "data", "assessment", "make_station_netcdf.py");

    /// <summary>Writes the file of <paramref name="testCase"/> to <paramref name="path"/> and returns the path.</summary>
    public static string Write(string path, string testCase)
    {
        var start = new ProcessStartInfo("/usr/bin/python3") { RedirectStandardError = true, UseShellExecute = false };
        start.ArgumentList.Add(Script);
        start.ArgumentList.Add(path);
        start.ArgumentList.Add(testCase);
        using var process = Process.Start(start) ?? throw new InvalidOperationException("Could not start /usr/bin/python3.");
        var error = process.StandardError.ReadToEnd();
        process.WaitForExit();
        if (process.ExitCode != 0) throw new InvalidOperationException($"make_station_netcdf.py {testCase} failed: {error}");
        return path;
    }
}
