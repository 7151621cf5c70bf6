using System.Diagnostics;

namespace Atlas.TestSupport;

/// <summary>
/// Runs tests/data/ingest/make_fixture.py, which writes a small CF hindcast file with netCDF4-python (a writer the
/// project did not write) whose values are a closed form of (hour, j, i).
/// </summary>
public static class NetCdf4PythonFixture
{
    public static string Make(string path, double startHours, int steps, string extra = "")
    {
        var script = Path.Combine(Storage.AtlasHome.FindCheckout(AppContext.BaseDirectory)!, "tests", "data", "ingest", "make_fixture.py");
        var start = new ProcessStartInfo("/usr/bin/python3", $"\"{script}\" \"{path}\" {startHours} {steps} {extra}")
        {
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        using var process = Process.Start(start)!;
        var error = process.StandardError.ReadToEnd();
        process.WaitForExit();
        if (process.ExitCode != 0) throw new InvalidOperationException($"make_fixture.py failed: {error}");
        return path;
    }
}
