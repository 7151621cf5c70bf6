using Atlas.TestSupport;
using Npgsql;

namespace Atlas.Storage.Tests;

/// <summary>
/// How a process looks at the schema at its start: with every script applied and unchanged it goes on at once; with
/// something to apply it queues on one advisory lock behind a process already migrating; a changed script is still
/// refused. Each test has its own database and its own copy of the scripts.
/// </summary>
public sealed class MigrationGateTests : IAsyncLifetime
{
    private readonly TestDatabase _database = new();
    private readonly string _folder = Path.Combine(Path.GetTempPath(), "atlas-migrations-" + Guid.NewGuid().ToString("N")[..8]);

    // Two processes starting together (two workers of one pass) with a script to apply: the second waits in
    // PostgreSQL's lock queue for the first's migration, seen in pg_locks as an advisory lock not granted (PostgreSQL
    // documentation, "Viewing Locks"), and applies the script when the lock is released, instead of sleeping out a retry.
    [Fact]
    public async Task AMigrationStartedWhileAnotherRunsWaitsInTheLockQueue()
    {
        File.WriteAllText(Path.Combine(_folder, "V99__gate_probe.sql"), "CREATE TABLE gate_probe (x integer);\n");
        await using var holder = new NpgsqlConnection(_database.ConnectionString);
        await holder.OpenAsync();
        await using (var take = new NpgsqlCommand($"SELECT pg_advisory_lock({SchemaMigrator.GateKeySql})", holder))
            await take.ExecuteNonQueryAsync();
        var second = Task.Run(() => SchemaMigrator.Migrate(_database.ConnectionString, folder: _folder));
        var waiting = false;
        // No time limit: the loop ends when the second migration is seen waiting, or has finished without waiting.
        while (!waiting && !second.IsCompleted)
        {
            await using var look = _database.DataSource.CreateCommand(
                $"SELECT EXISTS (SELECT 1 FROM pg_locks WHERE locktype = 'advisory' AND NOT granted AND objid = ({SchemaMigrator.GateKeySql})::oid)");
            waiting = (bool)(await look.ExecuteScalarAsync())!;
            if (!waiting) await Task.Delay(50);
        }
        Assert.True(waiting, "the second migration is not queued on the gate lock");
        Assert.False(second.IsCompleted);
        await using (var release = new NpgsqlCommand($"SELECT pg_advisory_unlock({SchemaMigrator.GateKeySql})", holder))
            await release.ExecuteNonQueryAsync();
        Assert.Equal(1, await second);
        Assert.Equal(0, SchemaMigrator.Migrate(_database.ConnectionString, folder: _folder));
    }

    // Nothing to apply: the start does not take the lock at all, so it goes on while another process holds it.
    [Fact]
    public async Task WithEveryScriptAppliedAStartDoesNotWaitForTheLock()
    {
        await using var holder = new NpgsqlConnection(_database.ConnectionString);
        await holder.OpenAsync();
        await using (var take = new NpgsqlCommand($"SELECT pg_advisory_lock({SchemaMigrator.GateKeySql})", holder))
            await take.ExecuteNonQueryAsync();
        Assert.Equal(0, await Task.Run(() => SchemaMigrator.Migrate(_database.ConnectionString, folder: _folder)));
    }

    // An applied script changed afterwards is not taken as applied: Evolve compares its checksum and refuses.
    [Fact]
    public void AChangedScriptIsRefused()
    {
        var first = Directory.GetFiles(_folder, "V1__*.sql").Single();
        File.AppendAllText(first, "\n-- changed after it was applied\n");
        var error = Assert.ThrowsAny<Exception>(() => SchemaMigrator.Migrate(_database.ConnectionString, folder: _folder));
        Assert.Contains("checksum", error.Message, StringComparison.OrdinalIgnoreCase);
    }

    public async Task InitializeAsync()
    {
        await _database.InitializeAsync();
        Directory.CreateDirectory(_folder);
        foreach (var file in Directory.GetFiles(SchemaMigrator.MigrationsFolder, "*.sql"))
            File.Copy(file, Path.Combine(_folder, Path.GetFileName(file)));
    }

    public async Task DisposeAsync()
    {
        await _database.DisposeAsync();
        Directory.Delete(_folder, recursive: true);
    }
}
