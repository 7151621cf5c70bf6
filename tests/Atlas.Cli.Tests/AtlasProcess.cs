using System.Diagnostics;

namespace Atlas.Cli.Tests;

/// <summary>Runs the built <c>atlas</c> command as a user would, with its own environment.</summary>
public static class AtlasProcess
{
    public static (int Code, string Output) Run(string arguments, IDictionary<string, string>? environment = null, int timeoutSeconds = 600)
    {
        var start = new ProcessStartInfo("dotnet", $"\"{Path.Combine(AppContext.BaseDirectory, "atlas.dll")}\" {arguments}")
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        foreach (var (key, value) in environment ?? new Dictionary<string, string>()) start.Environment[key] = value;
        using var process = Process.Start(start)!;
        var stdout = process.StandardOutput.ReadToEndAsync();
        var stderr = process.StandardError.ReadToEndAsync();
        if (!process.WaitForExit(timeoutSeconds * 1000))
        {
            process.Kill(entireProcessTree: true);
            throw new TimeoutException($"atlas {arguments} did not finish within {timeoutSeconds} s");
        }
        return (process.ExitCode, stdout.Result + stderr.Result);
    }
}
