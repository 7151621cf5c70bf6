using System.Diagnostics;
using System.Text.Json;

namespace Atlas.Assessment.Tests;

/// <summary>
/// Runs a script under Debian's /usr/bin/python3 (NumPy and SciPy from the distribution — not the
/// python3 first on PATH), passing a JSON document on standard input and reading one from standard
/// output. Test classes call it once, from a fixture, to keep the suite quick. Only quick NumPy/SciPy work runs
/// here; a slow reference is stored under tests/data/assessment with its script. There is no time limit: on a busy
/// machine a script may take many times longer than alone, and only CI's limit for the whole suite applies.
/// </summary>
internal static class ReferencePython
{
    public const string Interpreter = "/usr/bin/python3";

    public static JsonElement Run(string script, object input)
    {
        var start = new ProcessStartInfo(Interpreter)
        {
            RedirectStandardInput = true,
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        start.ArgumentList.Add("-c");
        start.ArgumentList.Add(script);
        using var process = Process.Start(start) ?? throw new InvalidOperationException($"Could not start {Interpreter}.");
        var errorText = process.StandardError.ReadToEndAsync();
        var outputText = process.StandardOutput.ReadToEndAsync();
        process.StandardInput.Write(JsonSerializer.Serialize(input));
        process.StandardInput.Close();
        process.WaitForExit();
        if (process.ExitCode != 0)
            throw new InvalidOperationException($"The reference script failed ({process.ExitCode}):\n{errorText.Result}");
        return JsonDocument.Parse(outputText.Result).RootElement.Clone();
    }

    public static double[] Doubles(this JsonElement element, string name) =>
        [.. element.GetProperty(name).EnumerateArray().Select(e => e.GetDouble())];

    public static double Double(this JsonElement element, string name) => element.GetProperty(name).GetDouble();
}
