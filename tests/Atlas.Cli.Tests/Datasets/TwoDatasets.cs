using Atlas.TestSupport;

namespace Atlas.Cli.Tests.Datasets;

/// <summary>
/// A fresh database holding two datasets loaded by the command line from the demo's generated files: the demo itself
/// (two months, statistics computed) and a second one from the first month alone without statistics. Tests that
/// remove a dataset load a third of their own with <see cref="Load"/>, so the two stay as they are.
/// </summary>
public sealed class TwoDatasets : IAsyncLifetime
{
    public const string Demo = "skelvane-reach";
    public const string Second = "second-month";

    public TestDatabase Database { get; } = new();

    public string Home { get; } = Directory.CreateTempSubdirectory("atlas-datasets-home-").FullName;

    public Dictionary<string, string> Environment => new() { ["ATLAS_DB"] = Database.ConnectionString, ["ATLAS_HOME"] = Home };

    /// <summary>The demo's first hindcast file.</summary>
    public string FirstMonthFile => Directory.GetFiles(Path.Combine(Home, "demo"), "*-2021-01.nc").Single();

    public async Task InitializeAsync()
    {
        await Database.InitializeAsync();
        var (demo, demoOutput) = AtlasProcess.Run("demo --months 2", Environment);
        Assert.True(demo == 0, demoOutput);
        Load(Second, "--no-stats");
    }

    /// <summary>Loads the first month into a new dataset <paramref name="slug"/> (with its statistics unless told otherwise).</summary>
    public void Load(string slug, string options = "")
    {
        var (code, output) = AtlasProcess.Run($"ingest \"{FirstMonthFile}\" --dataset {slug} {options}", Environment);
        Assert.True(code == 0, output);
    }

    public async Task DisposeAsync()
    {
        await Database.DisposeAsync();
        Directory.Delete(Home, recursive: true);
    }
}
