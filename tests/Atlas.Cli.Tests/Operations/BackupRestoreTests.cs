using System.Diagnostics;
using Atlas.Cli.Tests.Faults;
using Atlas.TestSupport;
using Npgsql;

namespace Atlas.Cli.Tests.Operations;

/// <summary>deploy/backup.sh then deploy/restore.sh (pg_dump and pg_restore) on a small loaded database.</summary>
public sealed class BackupRestoreTests(TestDatabase database) : IClassFixture<TestDatabase>, IDisposable
{
    private static readonly string Checkout = Storage.AtlasHome.FindCheckout(AppContext.BaseDirectory)!;
    private readonly string _folder = Directory.CreateTempSubdirectory("atlas-backup-").FullName;
    private readonly string _restored = "atlas_restored_" + Guid.NewGuid().ToString("N")[..10];

    [Fact]
    public async Task ARestoredBackupHoldsEveryRowOfEveryTableUnchanged()
    {
        var environment = new Dictionary<string, string> { ["ATLAS_DB"] = database.ConnectionString };
        var file = HindcastFixture.Make(_folder, "backed-up.nc", 240, 8, 6);
        var (code, output) = AtlasProcess.Run($"ingest \"{file}\" --dataset backed-up", environment);
        Assert.True(code == 0, output);
        Assert.True(await StoredHindcast.CountAsync(database.DataSource, "SELECT count(*) FROM cell_statistic") > 0, "the statistics were not computed");

        var dump = Path.Combine(_folder, "atlas.dump");
        (code, output) = Bash($"deploy/backup.sh \"{dump}\"", environment);
        Assert.True(code == 0, output);
        (code, output) = Bash($"deploy/restore.sh \"{dump}\" {_restored}", environment);
        Assert.True(code == 0, output);
        Assert.Contains("1 dataset(s)", output);

        var restoredConnection = new NpgsqlConnectionStringBuilder(database.ConnectionString) { Database = _restored, Pooling = false }.ConnectionString;
        await using var restored = NpgsqlDataSource.Create(restoredConnection);
        var before = await TableFingerprintsAsync(database.DataSource);
        var after = await TableFingerprintsAsync(restored);
        Assert.Contains("series_chunk", before.Keys);
        Assert.Contains("statistic_block", before.Keys);
        Assert.True(before["series_chunk"].Rows > 0 && before["statistic_block"].Rows > 0);
        Assert.Equal(before, after);

        // A second restore into the now full database is refused rather than mixed in.
        (code, output) = Bash($"deploy/restore.sh \"{dump}\" {_restored}", environment);
        Assert.Equal(1, code);
        Assert.Contains("not empty", output);
    }

    /// <summary>Per table of the schema: its row count and the md5 of all its rows as text, in a fixed order.</summary>
    private static async Task<SortedDictionary<string, (long Rows, string Md5)>> TableFingerprintsAsync(NpgsqlDataSource dataSource)
    {
        var tables = new List<string>();
        await using (var list = dataSource.CreateCommand("SELECT tablename FROM pg_tables WHERE schemaname = 'public' ORDER BY 1"))
        await using (var reader = await list.ExecuteReaderAsync())
            while (await reader.ReadAsync()) tables.Add(reader.GetString(0));
        var result = new SortedDictionary<string, (long, string)>(StringComparer.Ordinal);
        foreach (var table in tables)
        {
            await using var command = dataSource.CreateCommand(
                $"SELECT count(*), coalesce(md5(string_agg(t::text, '|' ORDER BY t::text)), '') FROM \"{table}\" t");
            await using var reader = await command.ExecuteReaderAsync();
            await reader.ReadAsync();
            result[table] = (reader.GetInt64(0), reader.GetString(1));
        }
        return result;
    }

    private static (int Code, string Output) Bash(string script, IDictionary<string, string> environment)
    {
        var start = new ProcessStartInfo("bash", script)
        {
            RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false, WorkingDirectory = Checkout,
        };
        foreach (var (key, value) in environment) start.Environment[key] = value;
        using var process = Process.Start(start)!;
        var stdout = process.StandardOutput.ReadToEndAsync();
        var stderr = process.StandardError.ReadToEnd();
        if (!process.WaitForExit(Patience.Limit)) { process.Kill(entireProcessTree: true); throw new TimeoutException(script); }
        return (process.ExitCode, stdout.Result + stderr);
    }

    public void Dispose()
    {
        NpgsqlConnection.ClearAllPools();
        using (var admin = database.DataSource.CreateCommand($"DROP DATABASE IF EXISTS {_restored} WITH (FORCE)")) admin.ExecuteNonQuery();
        Directory.Delete(_folder, recursive: true);
    }
}
