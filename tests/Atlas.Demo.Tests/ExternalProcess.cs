using System.Diagnostics;

namespace Atlas.Demo.Tests;

/// <summary>Runs a reference tool (ncdump, the Debian Python) and returns its standard output.</summary>
internal static class ExternalProcess
{
    /// <summary>The Debian interpreter, which carries NumPy and netCDF4-python (another python3 may come first on PATH).</summary>
    public const string DebianPython = "/usr/bin/python3";

    public static string Run(string fileName, params string[] arguments)
    {
        var start = new ProcessStartInfo(fileName)
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        // HDF5 locks a file it creates, and a tool started meanwhile by another test of this process inherits the
        // descriptor (native libraries open files without close-on-exec), keeping the lock after the writer closed
        // the file: a reader that tries to lock it then fails with "HDF error". Readers here need no lock.
        start.Environment["HDF5_USE_FILE_LOCKING"] = "FALSE";
        foreach (var a in arguments) start.ArgumentList.Add(a);
        using var process = Process.Start(start) ?? throw new InvalidOperationException($"could not start {fileName}");
        var stderr = process.StandardError.ReadToEndAsync();
        string stdout = process.StandardOutput.ReadToEnd();
        // No time limit of its own: on a busy machine a tool may take many times longer than alone; CI's limit applies.
        process.WaitForExit();
        if (process.ExitCode != 0)
            throw new InvalidOperationException($"{fileName} {string.Join(' ', arguments)} exited with {process.ExitCode}: {stderr.Result}");
        return stdout;
    }

    /// <summary>Runs one of the scripts under Python/ with the Debian interpreter.</summary>
    public static string RunPythonScript(string script, params string[] arguments) =>
        Run(DebianPython, [Path.Combine(AppContext.BaseDirectory, "Python", script), .. arguments]);
}
