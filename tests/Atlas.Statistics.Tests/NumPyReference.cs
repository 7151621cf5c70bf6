using System.Diagnostics;
using System.Runtime.InteropServices;
using System.Text.Json;
using System.Text.Json.Nodes;

namespace Atlas.Statistics.Tests;

/// <summary>
/// Runs a reference script of tests/data/statistics with Debian's NumPy/SciPy (/usr/bin/python3, never the first
/// python3 on PATH) on arrays written to a temporary folder, and returns the JSON it prints.
/// </summary>
internal sealed class NumPyReference : IDisposable
{
    private const string Interpreter = "/usr/bin/python3";

    public NumPyReference()
    {
        Folder = Directory.CreateTempSubdirectory("atlas-statistics-reference-").FullName;
    }

    public string Folder { get; }

    public NumPyReference Write<T>(string fileName, ReadOnlySpan<T> values) where T : unmanaged
    {
        File.WriteAllBytes(Path.Combine(Folder, fileName), MemoryMarshal.AsBytes(values).ToArray());
        return this;
    }

    public NumPyReference WriteJson(string fileName, object value)
    {
        File.WriteAllText(Path.Combine(Folder, fileName), JsonSerializer.Serialize(value));
        return this;
    }

    public JsonNode Run(string script)
    {
        string path = Path.Combine(AppContext.BaseDirectory, "data", "statistics", script);
        var start = new ProcessStartInfo(Interpreter) { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        start.ArgumentList.Add(path);
        start.ArgumentList.Add(Folder);
        using Process process = Process.Start(start) ?? throw new InvalidOperationException($"Could not start {Interpreter}.");
        Task<string> error = process.StandardError.ReadToEndAsync();
        string output = process.StandardOutput.ReadToEnd();
        process.WaitForExit();
        if (process.ExitCode != 0)
            throw new InvalidOperationException($"{Interpreter} {script} failed ({process.ExitCode}): {error.Result}");
        return JsonNode.Parse(output) ?? throw new InvalidOperationException($"{script} printed no JSON.");
    }

    public void Dispose()
    {
        try { Directory.Delete(Folder, recursive: true); } catch (IOException) { }
    }
}
