using Atlas.TestSupport;
using Npgsql;

namespace Atlas.Storage.Tests;

/// <summary>
/// A database migrated while the ledger was called atlas_schema_history keeps working: the next start renames it
/// (with its sequence and key) and applies nothing again.
/// </summary>
public sealed class MigrationLedgerTests : IAsyncLifetime
{
    private readonly string _name = "atlas_test_" + Guid.NewGuid().ToString("N")[..12];
    private string _admin = "";
    private string _connection = "";

    [Fact]
    public async Task FormerLedgerIsRenamedAndItsRecordKept()
    {
        // The database as the former code left it: Evolve with the former table name, every migration applied.
        await using (var connection = new NpgsqlConnection(_connection))
        {
            var evolve = new EvolveDb.Evolve(connection, _ => { })
            {
                Locations = [SchemaMigrator.MigrationsFolder], MetadataTableName = SchemaMigrator.FormerHistoryTable, IsEraseDisabled = true,
            };
            evolve.Migrate();
            Assert.Equal(SchemaMigrator.AvailableMigrationCount, evolve.NbMigration);
        }
        var formerRows = await ScalarAsync<long>($"SELECT count(*) FROM {SchemaMigrator.FormerHistoryTable}");

        var messages = new List<string>();
        Assert.Equal(0, SchemaMigrator.Migrate(_connection, messages.Add));
        Assert.Contains(messages, m => m.Contains("Renamed the migration ledger", StringComparison.Ordinal));
        Assert.False(await ScalarAsync<bool>($"SELECT to_regclass('{SchemaMigrator.FormerHistoryTable}') IS NOT NULL"));
        Assert.Equal(formerRows, await ScalarAsync<long>($"SELECT count(*) FROM {SchemaMigrator.HistoryTable}"));
        Assert.True(await ScalarAsync<bool>($"SELECT to_regclass('{SchemaMigrator.HistoryTable}_id_seq') IS NOT NULL"));
        Assert.True(await ScalarAsync<bool>($"SELECT to_regclass('{SchemaMigrator.HistoryTable}_pkey') IS NOT NULL"));
        await using (var source = AtlasDatabase.CreateDataSource(_connection))
            Assert.Equal(SchemaMigrator.AvailableMigrationCount, (await SchemaMigrator.AppliedVersionsAsync(source)).Count);
        // And again: nothing to rename, nothing to apply.
        Assert.Equal(0, SchemaMigrator.Migrate(_connection));
    }

    private async Task<T> ScalarAsync<T>(string sql)
    {
        await using var connection = new NpgsqlConnection(_connection);
        await connection.OpenAsync();
        await using var command = new NpgsqlCommand(sql, connection);
        return (T)(await command.ExecuteScalarAsync())!;
    }

    public async Task InitializeAsync()
    {
        _admin = await AtlasDatabase.ResolveConnectionStringAsync();
        await using var admin = new NpgsqlConnection(_admin);
        await admin.OpenAsync();
        await using var create = new NpgsqlCommand($"CREATE DATABASE {_name}", admin);
        await create.ExecuteNonQueryAsync();
        _connection = new NpgsqlConnectionStringBuilder(_admin) { Database = _name }.ConnectionString;
    }

    public async Task DisposeAsync()
    {
        NpgsqlConnection.ClearAllPools();
        await using var admin = new NpgsqlConnection(_admin);
        await admin.OpenAsync();
        await using var drop = new NpgsqlCommand($"DROP DATABASE IF EXISTS {_name} WITH (FORCE)", admin);
        await drop.ExecuteNonQueryAsync();
    }
}
