using System.Diagnostics;
using Atlas.TestSupport;

namespace Atlas.Api.Tests.Support;

/// <summary>Runs a reference tool (GDAL, ncdump, Debian's NumPy) and returns its output; throws with stderr on failure.</summary>
public static class ExternalTool
{
    /// <summary>Debian's interpreter, which has NumPy, netCDF4 and GDAL's bindings (not whatever python3 is first on PATH).</summary>
    public const string Python = "/usr/bin/python3";

    public static string Run(string program, params string[] arguments)
    {
        var start = new ProcessStartInfo(program) { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        // HDF5 locks a file it creates, and a tool started meanwhile by another test of this process inherits the
        // descriptor (native libraries open files without close-on-exec), keeping the lock after the writer closed
        // the file: a reader that tries to lock it then fails with "HDF error". Readers here need no lock.
        start.Environment["HDF5_USE_FILE_LOCKING"] = "FALSE";
        foreach (var a in arguments) start.ArgumentList.Add(a);
        using var process = Process.Start(start) ?? throw new InvalidOperationException($"{program} did not start.");
        var output = process.StandardOutput.ReadToEndAsync();
        var error = process.StandardError.ReadToEndAsync();
        if (!process.WaitForExit(Patience.Limit)) { process.Kill(true); throw new TimeoutException($"{program} took over {Patience.Limit.TotalMinutes} min."); }
        if (process.ExitCode != 0)
            throw new InvalidOperationException($"{program} {string.Join(' ', arguments)} exited {process.ExitCode}: {error.Result}{output.Result}");
        return output.Result;
    }

    public static string TempFile(string extension) => Path.Combine(Path.GetTempPath(), $"atlas-api-test-{Guid.NewGuid():N}{extension}");
}
