namespace Atlas.Assessment.Tests;

/// <summary>Opens the files under tests/data/assessment (copied beside the test assembly).</summary>
internal static class TestData
{
    public static StreamReader Open(string fileName) =>
        new(Path.Combine(AppContext.BaseDirectory, "data", "assessment", fileName));
}
