using System.Diagnostics;

namespace Atlas.Statistics.Tests;

/// <summary>Runs a reference tool (CDO, Debian's python3) with its arguments and returns what it printed.</summary>
internal static class ExternalTool
{
    public static string Run(string file, params string[] arguments)
    {
        var start = new ProcessStartInfo(file) { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        foreach (string argument in arguments) start.ArgumentList.Add(argument);
        using Process process = Process.Start(start) ?? throw new InvalidOperationException($"Could not start {file}.");
        Task<string> error = process.StandardError.ReadToEndAsync();
        string output = process.StandardOutput.ReadToEnd();
        process.WaitForExit();
        if (process.ExitCode != 0) throw new InvalidOperationException($"{file} {string.Join(' ', arguments)} failed ({process.ExitCode}): {error.Result}");
        return output;
    }
}
