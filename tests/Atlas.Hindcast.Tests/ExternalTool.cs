using System.Diagnostics;

namespace Atlas.Hindcast.Tests;

/// <summary>Runs the reference tools the fixtures and checks come from (ncgen, ncdump, Debian's /usr/bin/python3).</summary>
internal static class ExternalTool
{
    /// <summary>Debian's interpreter, which has NumPy, netCDF4 and cftime; another python3 may be first on PATH.</summary>
    public const string Python = "/usr/bin/python3";

    public static string Run(string executable, IEnumerable<string> arguments, string? standardInput = null)
    {
        var start = new ProcessStartInfo(executable)
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            RedirectStandardInput = standardInput is not null,
            UseShellExecute = false,
        };
        foreach (var a in arguments) start.ArgumentList.Add(a);
        using var process = Process.Start(start) ?? throw new InvalidOperationException($"could not start {executable}");
        if (standardInput is not null)
        {
            process.StandardInput.Write(standardInput);
            process.StandardInput.Close();
        }
        var stdout = process.StandardOutput.ReadToEndAsync();
        var stderr = process.StandardError.ReadToEndAsync();
        process.WaitForExit();
        if (process.ExitCode != 0)
            throw new InvalidOperationException($"{executable} {string.Join(' ', arguments)} exited {process.ExitCode}: {stderr.Result}");
        return stdout.Result;
    }
}
