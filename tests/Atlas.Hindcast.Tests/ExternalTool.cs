using System.Diagnostics;

namespace Atlas.Hindcast.Tests;

/// <summary>Runs the reference tools the fixtures and checks come from (ncgen, ncdump, Debian's /usr/bin/python3).</summary>
internal static class ExternalTool
{
    /// <summary>Debian's interpreter, which has NumPy, netCDF4 and cftime; another python3 may be first on PATH.</summary>
    public const string Python = "/usr/bin/python3";

    /// <summary>Standard output of a run that must succeed.</summary>
    public static string Run(string executable, IEnumerable<string> arguments, string? standardInput = null)
    {
        var (code, stdout, stderr) = Start(executable, arguments, standardInput);
        if (code != 0)
            throw new InvalidOperationException($"{executable} {string.Join(' ', arguments)} exited {code}: {stderr}");
        return stdout;
    }

    /// <summary>Standard output and error of a run, whatever its exit code (usage texts, refusals).</summary>
    public static string Output(string executable, IEnumerable<string> arguments)
    {
        var (_, stdout, stderr) = Start(executable, arguments, null);
        return stdout + stderr;
    }

    private static (int Code, string Stdout, string Stderr) Start(string executable, IEnumerable<string> arguments, string? standardInput)
    {
        var start = new ProcessStartInfo(executable)
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            RedirectStandardInput = standardInput is not null,
            UseShellExecute = false,
        };
        foreach (var a in arguments) start.ArgumentList.Add(a);
        // HDF5 locks a file it creates, and a tool started meanwhile by another test of this process inherits the
        // descriptor (native libraries open files without close-on-exec), keeping the lock after the writer closed
        // the file: a reader that tries to lock it then fails with "HDF error". Readers here need no lock.
        start.Environment["HDF5_USE_FILE_LOCKING"] = "FALSE";
        using var process = Process.Start(start) ?? throw new InvalidOperationException($"could not start {executable}");
        if (standardInput is not null)
        {
            process.StandardInput.Write(standardInput);
            process.StandardInput.Close();
        }
        var stdout = process.StandardOutput.ReadToEndAsync();
        var stderr = process.StandardError.ReadToEndAsync();
        process.WaitForExit();
        return (process.ExitCode, stdout.Result, stderr.Result);
    }
}
