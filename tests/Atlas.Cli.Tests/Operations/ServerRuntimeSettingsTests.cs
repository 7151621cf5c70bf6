using System.Text.Json;
using Atlas.Cli.Commands;
using Atlas.TestSupport;

namespace Atlas.Cli.Tests.Operations;

/// <summary>
/// Batch commands run with the runtime settings of atlas.runtimeconfig.json (workstation collector, no profile-guided
/// recompilation); <c>atlas serve</c> starts itself again with the server's, keeping its process id and any value
/// the operator gave. Checked from outside the process, in Linux's /proc: its environment and the runtime's threads.
/// </summary>
public sealed class ServerRuntimeSettingsTests(TestDatabase database) : IClassFixture<TestDatabase>
{
    [Fact]
    public void BatchCommandsRunWithTheWorkstationCollectorAndNoProfileGuidedRecompilation()
    {
        // The runtime's documented names (learn.microsoft.com, runtime configuration options for garbage collection
        // and compilation): System.GC.Server and System.Runtime.TieredPGO.
        using var config = JsonDocument.Parse(File.ReadAllText(Path.Combine(AppContext.BaseDirectory, "atlas.runtimeconfig.json")));
        var properties = config.RootElement.GetProperty("runtimeOptions").GetProperty("configProperties");
        Assert.False(properties.GetProperty("System.GC.Server").GetBoolean());
        Assert.False(properties.GetProperty("System.Runtime.TieredPGO").GetBoolean());
    }

    [Fact]
    public async Task TheDemoLoadedBecomesAServerWithTheServerSettings()
    {
        var port = RunningAtlas.FreePort();
        using var demo = new RunningAtlas("demo --months 2 --serve", new Dictionary<string, string>
        {
            ["ATLAS_DB"] = database.ConnectionString,
            ["ATLAS_HOME"] = Directory.CreateTempSubdirectory("atlas-demo-serve-").FullName,
            ["ASPNETCORE_URLS"] = $"http://127.0.0.1:{port}",
        });
        using var http = new HttpClient();
        await Patience.UntilAsync(async () =>
        {
            try { return (await http.GetAsync($"http://127.0.0.1:{port}/api/v1/datasets/{DemoCommand.DatasetSlug}")).IsSuccessStatusCode; }
            catch (HttpRequestException) { return false; }
        }, $"the demo to be served\n{demo.Output}");

        Assert.Contains($"serving at http://127.0.0.1:{port}/", demo.Output);
        Assert.EndsWith("\0serve\0", File.ReadAllText($"/proc/{demo.Id}/cmdline"));
        var environment = File.ReadAllText($"/proc/{demo.Id}/environ").Split('\0');
        Assert.Contains("DOTNET_gcServer=1", environment);
        Assert.Contains("DOTNET_TieredPGO=1", environment);
    }

    [Fact]
    public async Task ServeRestartsItselfWithTheServerSettingsKeepingItsIdAndTheOperatorsValues()
    {
        var port = RunningAtlas.FreePort();
        using var server = new RunningAtlas("serve", new Dictionary<string, string>
        {
            ["ATLAS_DB"] = database.ConnectionString,
            ["ASPNETCORE_URLS"] = $"http://127.0.0.1:{port}",
            // Given by the operator: kept as given.
            ["DOTNET_TieredPGO"] = "0",
        });
        using var http = new HttpClient();
        await Patience.UntilAsync(async () =>
        {
            try { return (await http.GetAsync($"http://127.0.0.1:{port}/healthz")).IsSuccessStatusCode; }
            catch (HttpRequestException) { return false; }
        }, $"the server to answer\n{server.Output}");

        // The process the test started (same id) now runs with the settings in its environment.
        var environment = File.ReadAllText($"/proc/{server.Id}/environ").Split('\0');
        Assert.Contains("DOTNET_gcServer=1", environment);
        Assert.Contains("DOTNET_TieredPGO=0", environment);
        Assert.DoesNotContain("DOTNET_TieredPGO=1", environment);
        // The server collector runs on threads of its own, which the runtime names ".NET Server GC".
        Assert.Contains(".NET Server GC", ThreadNames(server.Id));
        // Still the command it was: its arguments and name unchanged.
        Assert.EndsWith("\0serve\0", File.ReadAllText($"/proc/{server.Id}/cmdline"));
        Assert.Equal("dotnet", File.ReadAllText($"/proc/{server.Id}/comm").Trim());
        Assert.DoesNotContain("could not restart", server.Output);
        Assert.Equal(["DOTNET_gcServer", "DOTNET_TieredPGO"], ServerRuntimeSettings.Settings.Select(s => s.Name));
    }

    /// <summary>The names of a process's threads; a thread that ends while they are read is passed over.</summary>
    private static List<string> ThreadNames(int pid)
    {
        var names = new List<string>();
        foreach (var thread in Directory.GetDirectories($"/proc/{pid}/task"))
        {
            try { names.Add(File.ReadAllText(Path.Combine(thread, "comm")).Trim()); }
            catch (IOException) { }
        }
        return names;
    }
}
