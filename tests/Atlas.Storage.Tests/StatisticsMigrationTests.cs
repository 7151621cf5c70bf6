using Npgsql;

namespace Atlas.Storage.Tests;

/// <summary>
/// Migration V5 moves statistics stored one row per cell (V1's table) into blocks; read back through the view that
/// replaces the table, every row is as it was.
/// </summary>
public sealed class StatisticsMigrationTests : IAsyncLifetime
{
    private readonly string _name = "atlas_test_v5_" + Guid.NewGuid().ToString("N")[..10];
    private string _admin = "", _connection = "";

    [Fact]
    public async Task RowsStoredBeforeTheBlockLayoutReadTheSameThroughTheView()
    {
        SchemaMigrator.Migrate(_connection, targetVersion: "4");
        await ExecuteAsync("""
            INSERT INTO cell_statistic
            SELECT d, c, p, q, CASE WHEN c % 7 = 0 THEN NULL ELSE c * 0.5 + p END, 0.25, 0, c, NULL, 1.5, 2.5, 3.5,
                   100 + c, 0.9, CASE q WHEN 0 THEN ARRAY[0.5, c / 3000.0, 0]::real[] WHEN 6 THEN array_fill(0.0625::real, ARRAY[16]) END
              FROM generate_series(1, 2) d, generate_series(0, 2500, 3) c, (VALUES (0), (1), (13), (2019)) per(p), (VALUES (0), (3), (6)) par(q)
            """);
        const string Rows = "SELECT string_agg(s::text, '|' ORDER BY dataset_id, cell_id, period, parameter) FROM cell_statistic s";
        var before = await ScalarAsync<string>(Rows);

        SchemaMigrator.Migrate(_connection);
        Assert.Equal(before, await ScalarAsync<string>(Rows));
        // 834 cells in three blocks (0..1023, 1024..2047, 2048..2500), 4 periods, 3 parameters, 2 datasets.
        Assert.Equal(3L * 4 * 3 * 2, await ScalarAsync<long>("SELECT count(*) FROM statistic_block"));
        Assert.Equal(3L, await ScalarAsync<long>("SELECT count(*) FROM pg_class WHERE relname IN ('statistic_block', 'cell_statistic', 'cell_statistic_state')"));
    }

    private async Task ExecuteAsync(string sql)
    {
        await using var connection = new NpgsqlConnection(_connection);
        await connection.OpenAsync();
        await using var command = new NpgsqlCommand(sql, connection);
        await command.ExecuteNonQueryAsync();
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
        _connection = new NpgsqlConnectionStringBuilder(_admin) { Database = _name, Pooling = false }.ConnectionString;
    }

    public async Task DisposeAsync()
    {
        await using var admin = new NpgsqlConnection(_admin);
        await admin.OpenAsync();
        await using var drop = new NpgsqlCommand($"DROP DATABASE IF EXISTS {_name} WITH (FORCE)", admin);
        await drop.ExecuteNonQueryAsync();
    }
}
