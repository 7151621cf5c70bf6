using System.Diagnostics;
using Atlas.TestSupport;

namespace Atlas.Cli.Tests;

/// <summary>Runs the built <c>atlas</c> command as a user would, with its own environment; waits for it as long as CI does.</summary>
public static class AtlasProcess
{
    private static string Command(string arguments) => $"\"{Path.Combine(AppContext.BaseDirectory, "atlas.dll")}\" {arguments}";

    /// <param name="standardInput">Text given on standard input, which is then a pipe (not a terminal) closed after it;
    /// null to inherit the test runner's input.</param>
    public static (int Code, string Output) Run(string arguments, IDictionary<string, string>? environment = null, string? standardInput = null) =>
        Execute(new ProcessStartInfo("dotnet", Command(arguments)), arguments, environment, standardInput);

    /// <summary>
    /// Runs <c>atlas</c> on a pseudo-terminal, as an operator at a terminal runs it, answering with
    /// <paramref name="answer"/>: util-linux's <c>script</c> gives the command a terminal for its input and output.
    /// </summary>
    public static (int Code, string Output) RunOnTerminal(string arguments, string answer, IDictionary<string, string> environment)
    {
        var start = new ProcessStartInfo("script");
        foreach (var argument in (string[])["-qec", "dotnet " + Command(arguments), "/dev/null"]) start.ArgumentList.Add(argument);
        return Execute(start, arguments, environment, answer + "\n");
    }

    private static (int Code, string Output) Execute(ProcessStartInfo start, string arguments, IDictionary<string, string>? environment, string? standardInput)
    {
        start.RedirectStandardOutput = true;
        start.RedirectStandardError = true;
        start.RedirectStandardInput = standardInput is not null;
        start.UseShellExecute = false;
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
