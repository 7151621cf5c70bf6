using System.Diagnostics;
using Atlas.TestSupport;

namespace Atlas.Cli.Tests;

/// <summary>Runs the built <c>atlas</c> command as a user would, with its own environment; waits for it as long as CI does.</summary>
public static class AtlasProcess
{
    /// <param name="standardInput">Text given on standard input, which is then a pipe (not a terminal) closed after it;
    /// null to inherit the test runner's input.</param>
    public static (int Code, string Output) Run(string arguments, IDictionary<string, string>? environment = null, string? standardInput = null)
    {
        var start = new ProcessStartInfo("dotnet", $"\"{Path.Combine(AppContext.BaseDirectory, "atlas.dll")}\" {arguments}")
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            RedirectStandardInput = standardInput is not null,
            UseShellExecute = false,
        };
        foreach (var (key, value) in environment ?? new Dictionary<string, string>()) start.Environment[key] = value;
        using var process = Process.Start(start)!;
        if (standardInput is not null)
        {
            process.StandardInput.Write(standardInput);
            process.StandardInput.Close();
        }
        var stdout = process.StandardOutput.ReadToEndAsync();
        var stderr = process.StandardError.ReadToEndAsync();
        if (!process.WaitForExit(Patience.Limit))
        {
            process.Kill(entireProcessTree: true);
            throw new TimeoutException($"atlas {arguments} did not finish within {Patience.Limit.TotalMinutes} min");
        }
        return (process.ExitCode, stdout.Result + stderr.Result);
    }
}
