using System.Net;
using System.Text.Json;
using Atlas.Storage;
using Atlas.TestSupport;

namespace Atlas.Cli.Tests.Operations;

/// <summary>
/// <c>atlas serve</c> reading from a streaming standby (<c>ATLAS_DB_READ</c>) and writing to the primary
/// (<c>ATLAS_DB</c>), both throwaway embedded clusters on loopback ports of their own: files loaded on the primary are
/// answered from the standby once it has replayed them (the API's caches follow the replayed stamps, never stale),
/// and while the standby is down its reads are 503 problems, answered again once it is back. Every wait polls a
/// condition up to <see cref="Patience.Limit"/>; none sleeps a fixed time.
/// </summary>
public sealed class ReadReplicaTests : IAsyncLifetime
{
    private const int Nx = 6, Ny = 5, Steps = 40;
    private const string Slug = "replica-coast";
    private readonly string _home = Directory.CreateTempSubdirectory("atlas-replica-").FullName;
    private EmbeddedCluster _primary = null!;
    private EmbeddedCluster _standby = null!;

    public async Task InitializeAsync()
    {
        _primary = new EmbeddedCluster(Path.Combine(_home, "primary"), RunningAtlas.FreePort());
        await _primary.EnsureRunningAsync();
        SchemaMigrator.Migrate(_primary.ConnectionString);
        _standby = _primary.CreateStandby(Path.Combine(_home, "standby"), RunningAtlas.FreePort());
        await _standby.EnsureRunningAsync();
    }

    public Task DisposeAsync()
    {
        try
        {
            _standby.Stop();
            _primary.Stop();
        }
        finally { Directory.Delete(_home, recursive: true); }
        return Task.CompletedTask;
    }

    [Fact]
    public async Task TheApiAnswersFromTheStandbyWithWhatThePrimaryLoadedAndSays503WhileTheStandbyIsDown()
    {
        var environment = new Dictionary<string, string>
        {
            ["ATLAS_DB"] = _primary.ConnectionString,
            ["ATLAS_HOME"] = _home,
        };
        // The fixture's time axis (netCDF4-python, tests/data/ingest/make_fixture.py): 3-hourly from the start hour.
        var first = NetCdf4PythonFixture.Make(Path.Combine(_home, "first.nc"), 0, Steps, $"--nx {Nx} --ny {Ny}");
        var second = NetCdf4PythonFixture.Make(Path.Combine(_home, "second.nc"), Steps * 3, Steps, $"--nx {Nx} --ny {Ny}");
        Ingest(first, environment);

        var port = RunningAtlas.FreePort();
        environment["ASPNETCORE_URLS"] = $"http://127.0.0.1:{port}";
        environment["ATLAS_DB_READ"] = _standby.ConnectionString.Replace("Timeout=15", "Timeout=3");
        using var server = new RunningAtlas("serve", environment);
        using var http = new HttpClient { BaseAddress = new Uri($"http://127.0.0.1:{port}"), Timeout = Patience.Limit };

        // The standby has replayed the first load and its statistics.
        await UntilDatasetAsync(http, server, Steps);
        var point = $"/api/v1/datasets/{Slug}/point?lat=50.2&lon=-19.7&period=annual";
        Assert.Contains($"\"count\":{Steps}", await http.GetStringAsync(point));

        // A second file loaded on the primary: the standby replays it, and the API's answers follow.
        Ingest(second, environment);
        await UntilDatasetAsync(http, server, 2 * Steps);
        // Until the stamps cached for a moment move, an answer may still be of the first file alone; never half of it.
        var answer = await Patience.UntilAsync(() => http.GetAsync(point), r => r.StatusCode == HttpStatusCode.OK
                && r.Content.ReadAsStringAsync().GetAwaiter().GetResult().Contains($"\"count\":{2 * Steps}"),
            $"the point answer to count the second file's steps\n{server.Output}");
        Assert.DoesNotContain($"\"count\":{Steps}", await answer.Content.ReadAsStringAsync());

        // The standby stops while the primary runs on: reads are 503 problems with Retry-After, the server stays up.
        _standby.Stop();
        var outage = await Patience.UntilAsync(() => http.GetAsync($"/api/v1/datasets/{Slug}"), r => r.StatusCode == HttpStatusCode.ServiceUnavailable,
            $"reads to fail while the standby is down\n{server.Output}");
        Assert.Equal("application/problem+json", outage.Content.Headers.ContentType?.MediaType);
        Assert.NotNull(outage.Headers.RetryAfter);
        using (var problem = JsonDocument.Parse(await outage.Content.ReadAsStringAsync()))
            Assert.Equal(503, problem.RootElement.GetProperty("status").GetInt32());
        Assert.False(server.HasExited, server.Output);

        await _standby.EnsureRunningAsync();
        await UntilDatasetAsync(http, server, 2 * Steps);
    }

    private static void Ingest(string file, IDictionary<string, string> environment)
    {
        var (code, output) = AtlasProcess.Run($"ingest \"{file}\" --dataset {Slug}", environment);
        Assert.True(code == 0, output);
    }

    /// <summary>Waits until the dataset endpoint answers 200 with <paramref name="steps"/> time steps and every wet cell's statistics.</summary>
    private static Task UntilDatasetAsync(HttpClient http, RunningAtlas server, int steps) =>
        Patience.UntilAsync(async () =>
        {
            HttpResponseMessage response;
            try { response = await http.GetAsync($"/api/v1/datasets/{Slug}"); }
            catch (HttpRequestException) { return false; }
            if (response.StatusCode != HttpStatusCode.OK) return false;
            using var detail = JsonDocument.Parse(await response.Content.ReadAsStringAsync());
            var root = detail.RootElement;
            return root.GetProperty("time").GetProperty("step_count").GetInt32() == steps
                   && root.GetProperty("statistics_cell_count").GetInt32() == root.GetProperty("wet_cell_count").GetInt32();
        }, $"the API to answer from the standby with {steps} steps\n{server.Output}");
}
