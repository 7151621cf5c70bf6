using System.Text.Json;

namespace Atlas.Assessment.Tests;

/// <summary>Opens the files under tests/data/assessment (copied beside the test assembly).</summary>
internal static class TestData
{
    public static string PathOf(string fileName) => Path.Combine(AppContext.BaseDirectory, "data", "assessment", fileName);

    public static StreamReader Open(string fileName) => new(PathOf(fileName));

    public static JsonElement ReadJson(string fileName)
    {
        using var stream = File.OpenRead(PathOf(fileName));
        return JsonDocument.Parse(stream).RootElement.Clone();
    }
}
