using System.Diagnostics;
using System.Text.Json.Nodes;

namespace Atlas.TestSupport;

/// <summary>
/// Runs tests/data/ingest/make_point_spectra.py, which writes spectra at three invented output points with
/// netCDF4-python and, beside them, every step's parameters computed with NumPy and SciPy.
/// </summary>
public static class PointSpectraFixture
{
    public static string Make(string path, double startHours, int steps, string? variant = null)
    {
        var script = Path.Combine(Storage.AtlasHome.FindCheckout(AppContext.BaseDirectory)!, "tests", "data", "ingest", "make_point_spectra.py");
        var start = new ProcessStartInfo("/usr/bin/python3") { RedirectStandardError = true, UseShellExecute = false };
        foreach (var argument in new[] { script, path, startHours.ToString(System.Globalization.CultureInfo.InvariantCulture), steps.ToString() })
            start.ArgumentList.Add(argument);
        if (variant is not null) { start.ArgumentList.Add("--variant"); start.ArgumentList.Add(variant); }
        using var process = Process.Start(start)!;
        var error = process.StandardError.ReadToEnd();
        process.WaitForExit();
        if (process.ExitCode != 0) throw new InvalidOperationException($"make_point_spectra.py failed: {error}");
        return path;
    }

    /// <summary>The NumPy/SciPy expectations written beside a fixture: steps[t][station] objects.</summary>
    public static JsonNode Expected(string path) => JsonNode.Parse(File.ReadAllText(path + ".expected.json"))!;
}
