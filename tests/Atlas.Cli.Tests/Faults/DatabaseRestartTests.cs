using System.Collections.Concurrent;
using System.Diagnostics;
using System.Net;
using System.Text.Json;
using Atlas.Storage;
using Atlas.Storage.Jobs;
using Atlas.Storage.Passes;
using Atlas.TestSupport;
using Npgsql;

namespace Atlas.Cli.Tests.Faults;

/// <summary>
/// PostgreSQL stopped and started again under a steady load on a running <c>atlas serve</c>, and under a worker running
/// a statistics pass in parts: the part in hand fails on the outage and goes back to the queue, the worker carries on
/// once the server is back, and the pass completes with the blocks a plain pass stores. The database is a throwaway
/// embedded cluster in a temp folder on a port of its own (one per test), so no other test sees the outage.
/// </summary>
public sealed class DatabaseRestartTests : IAsyncLifetime
{
    private readonly string _home = Directory.CreateTempSubdirectory("atlas-fault-restart-").FullName;
    private EmbeddedCluster _cluster = null!;

    public async Task InitializeAsync()
    {
        _cluster = new EmbeddedCluster(_home, RunningAtlas.FreePort());
        await _cluster.EnsureRunningAsync();
    }

    public Task DisposeAsync()
    {
        try { _cluster.Stop(); }
        finally { Directory.Delete(_home, recursive: true); }
        return Task.CompletedTask;
    }

    private enum Phase { Up, Stopping, Down, Starting, After, Settled }

    private sealed record Answer(Phase Began, Phase Ended, int Status, string? ContentType, bool RetryAfter, string Url, string Body);

    [Fact]
    public async Task RequestsAreServiceUnavailableProblemsWhileTheDatabaseIsDownAndSucceedAfterWithNoCrash()
    {
        var environment = new Dictionary<string, string>
        {
            ["ATLAS_DB"] = _cluster.ConnectionString.Replace("Timeout=15", "Timeout=3"),
            ["ATLAS_HOME"] = _home,
            ["Logging__Console__FormatterName"] = "json",
            ["Logging__Console__FormatterOptions__IncludeScopes"] = "true",
            // The steady load is one client address; keep the per-address limit out of the way.
            ["AtlasApiOptions__ExpensiveRequestsPerMinute"] = "1000000",
        };
        var file = HindcastFixture.Make(_home, "restart.nc", 40, 6, 5);
        var (code, output) = AtlasProcess.Run($"ingest \"{file}\" --dataset restart-coast", environment);
        Assert.True(code == 0, output);

        var port = RunningAtlas.FreePort();
        environment["ASPNETCORE_URLS"] = $"http://127.0.0.1:{port}";
        using var server = new RunningAtlas("serve", environment);
        using var http = new HttpClient { BaseAddress = new Uri($"http://127.0.0.1:{port}"), Timeout = Patience.Limit };
        await Patience.UntilAsync(async () =>
        {
            try { return (await http.GetAsync("/readyz")).StatusCode == HttpStatusCode.OK; }
            catch (HttpRequestException) { return false; }
        }, $"the server to be ready\n{server.Output}");

        string[] urls =
        [
            "/api/v1/datasets", "/api/v1/datasets/restart-coast", "/api/v1/datasets/restart-coast/point?lat=50.2&lon=-19.7&period=annual",
            "/api/v1/datasets/restart-coast/point/series?lat=50.2&lon=-19.7&format=csv", "/readyz",
        ];
        var phase = Phase.Up;
        var answers = new ConcurrentQueue<Answer>();
        var failures = new ConcurrentQueue<string>();
        using var stopLoad = new CancellationTokenSource();
        var load = Enumerable.Range(0, 3).Select(client => Task.Run(async () =>
        {
            for (var n = client; !stopLoad.IsCancellationRequested; n++)
            {
                var url = urls[n % urls.Length];
                var began = phase;
                try
                {
                    using var response = await http.GetAsync(url);
                    var body = await response.Content.ReadAsStringAsync();
                    answers.Enqueue(new Answer(began, phase, (int)response.StatusCode, response.Content.Headers.ContentType?.MediaType,
                        response.Headers.RetryAfter is not null, url, body));
                }
                catch (Exception e) when (e is HttpRequestException or TaskCanceledException)
                {
                    failures.Enqueue($"{url}: {e.Message}");
                }
            }
        })).ToArray();

        // Each phase lasts until the answers it is judged by have arrived, however slowly a busy machine gives them
        // (a failure or a dead server ends the wait at once, for the assertions below to report).
        Task PhaseAsync(Func<Answer[], bool> enough, string what) =>
            Patience.UntilAsync(() => Task.FromResult(!failures.IsEmpty || server.HasExited || enough([.. answers])), what);
        bool AnsweredIn(Answer a, Phase p) => a.Began == p && a.Ended == p;

        await PhaseAsync(all => all.Count(a => AnsweredIn(a, Phase.Up)) >= urls.Length, "answers while the database is up");
        phase = Phase.Stopping;
        _cluster.Stop();
        phase = Phase.Down;
        await PhaseAsync(all => all.Count(a => AnsweredIn(a, Phase.Down)) >= 10
                                && all.Any(a => AnsweredIn(a, Phase.Down) && a.Url == "/readyz")
                                && all.Any(a => AnsweredIn(a, Phase.Down) && a.Status == 503 && a.Url.StartsWith("/api/", StringComparison.Ordinal)),
            "ten answers, a readiness answer and an API 503 while the database is down");
        phase = Phase.Starting;
        _cluster.Start();
        phase = Phase.After;
        // The pool drops its dead connections as they are tried; wait for two clean rounds of every URL, then expect
        // nothing but clean runs.
        await PhaseAsync(all => all.Where(a => a.Began == Phase.After).TakeLast(2 * urls.Length) is var last
                                && last.Count() == 2 * urls.Length && last.All(a => a.Status == 200),
            "two clean rounds of every URL after the restart");
        phase = Phase.Settled;
        await PhaseAsync(all => all.Count(a => a.Began == Phase.Settled) >= 2 * urls.Length, "two rounds of answers once settled");
        await stopLoad.CancelAsync();
        await Task.WhenAll(load);

        Assert.False(server.HasExited, server.Output);
        Assert.True(failures.IsEmpty, "the server stopped answering:\n" + string.Join('\n', failures.Take(5)) + "\n" + server.Output);
        var all = answers.ToArray();
        Assert.DoesNotContain(all, a => a.Status >= 500 && a.Status != 503);
        Assert.All(all.Where(a => a.Began == Phase.Up && a.Ended == Phase.Up), a => Assert.True(a.Status == 200, $"{a.Url}: {a.Status} {a.Body}"));
        var down = all.Where(a => a.Began == Phase.Down && a.Ended == Phase.Down).ToArray();
        Assert.True(down.Length >= 10, $"only {down.Length} requests were answered while the database was down");
        // Readiness always asks the database; other answers may come from the API's in-memory caches (a point
        // response already computed), which is fine: what is not cached must be a 503 problem, never another error.
        Assert.Contains(down, a => a.Url == "/readyz");
        Assert.All(down.Where(a => a.Url == "/readyz"), a => Assert.Equal(503, a.Status));
        Assert.Contains(down, a => a.Status == 503 && a.Url.StartsWith("/api/", StringComparison.Ordinal));
        foreach (var a in down.Where(a => a.Status != 200))
        {
            Assert.True(a.Status == 503, $"{a.Url} while down: {a.Status} {a.Body}");
            Assert.Equal("application/problem+json", a.ContentType);
            Assert.Equal(503, JsonDocument.Parse(a.Body).RootElement.GetProperty("status").GetInt32());
            if (!a.Url.StartsWith("/readyz", StringComparison.Ordinal)) Assert.True(a.RetryAfter, $"{a.Url} has no Retry-After");
        }
        var settled = all.Where(a => a.Began == Phase.Settled).ToArray();
        Assert.NotEmpty(settled);
        Assert.All(settled, a => Assert.True(a.Status == 200, $"{a.Url} after the restart: {a.Status} {a.Body}"));

        // Structured logs: the outage warnings are JSON lines carrying the request id of the request they belong to.
        var outageLine = server.Lines.FirstOrDefault(l => l.StartsWith('{') && l.Contains("Database unavailable", StringComparison.Ordinal));
        Assert.True(outageLine is not null, server.Output);
        var entry = JsonDocument.Parse(outageLine!).RootElement;
        Assert.Contains(entry.GetProperty("Scopes").EnumerateArray(), s => s.ValueKind == JsonValueKind.Object && s.TryGetProperty("RequestId", out _));
        Assert.Equal(0, server.Terminate());
    }

    [Fact]
    public async Task APassInPartsCompletesIdenticallyAfterThePrimaryRestartsUnderIt()
    {
        var environment = new Dictionary<string, string>
        {
            ["ATLAS_DB"] = _cluster.ConnectionString.Replace("Timeout=15", "Timeout=3"),
            ["ATLAS_HOME"] = _home,
        };
        void Run(string arguments)
        {
            var (code, output) = AtlasProcess.Run(arguments, environment);
            Assert.True(code == 0, $"atlas {arguments}:\n{output}");
        }
        const int Steps = 2920, Nx = 80, Ny = 60;
        var file = HindcastFixture.Make(_home, "restart.nc", Steps, Nx, Ny);
        Run($"ingest \"{file}\" --dataset restart-plain");
        Run($"ingest \"{file}\" --dataset restart-parts --no-stats");
        // Two parts: cell ids 0-4095 (three batches of up to 2,000 cells) and the rest.
        Run("stats restart-parts --queue --part-cells 4096");
        await using var dataSource = AtlasDatabase.CreateDataSource(_cluster.ConnectionString);
        var pass = Assert.Single(await new PassStore(dataSource).ProgressAsync("restart-parts")).Pass;

        // The first part is held at its end, whatever the machine's speed: this transaction shares the lock on the pass
        // row that staging a batch shares too and that marking a part done takes alone, so the part stages its batches
        // and then waits; the restart below always comes in the middle of it, and takes the lock away with the server.
        var holder = new NpgsqlConnection(_cluster.ConnectionString);
        await holder.OpenAsync();
        var hold = await holder.BeginTransactionAsync();
        await using (var share = new NpgsqlCommand("SELECT 1 FROM pass WHERE pass_id = $1 FOR SHARE", holder, hold))
        {
            share.Parameters.AddWithValue(pass.Id);
            await share.ExecuteScalarAsync();
        }

        using var worker = new RunningAtlas("worker", environment);
        // The first part under way, a batch of it staged: the server stops and starts under the worker.
        await Patience.UntilAsync(async () =>
        {
            var progress = Assert.Single(await new PassStore(dataSource).ProgressAsync("restart-parts"));
            await using var staged = dataSource.CreateCommand("SELECT count(*) FROM statistic_block_stage");
            return progress is { Done: 0, Running: 1 } && (long)(await staged.ExecuteScalarAsync())! > 0;
        }, $"the first part to stage its first batch\n{worker.Output}");
        _cluster.Stop();
        await _cluster.EnsureRunningAsync();
        // The test's own connections died with the server too.
        try { await holder.DisposeAsync(); } catch (NpgsqlException) { }
        dataSource.Clear();

        var done = await Patience.UntilAsync(() => new PassStore(dataSource).FindAsync(pass.Id), p => p!.State != "open",
            $"the pass to end after the restart\n{worker.Output}");
        Assert.True(done!.State == "done", $"{done.Error}\n{worker.Output}");
        var parts = (await new JobQueue(dataSource).ForDatasetAsync("restart-parts")).Where(j => j.PassId == pass.Id).ToList();
        Assert.All(parts, p => Assert.Equal("done", p.State));
        Assert.True(parts.Sum(p => p.Attempts) > parts.Count, "no part was retried: the restart came between parts");
        Assert.False(worker.HasExited, worker.Output);

        var expected = await StoredStatistics.BlocksAsync(dataSource, "restart-plain");
        Assert.NotEmpty(expected);
        Assert.Equal(expected, await StoredStatistics.BlocksAsync(dataSource, "restart-parts"));
    }
}
