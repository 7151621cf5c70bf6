using Atlas.Storage;
using Npgsql;
using Xunit;

namespace Atlas.TestSupport;

/// <summary>
/// A fresh, migrated database for one test class (an xunit class fixture), on the server ATLAS_DB names or on the
/// embedded cluster, dropped again when the class is done. Tests never share stored data.
/// </summary>
public sealed class TestDatabase : IAsyncLifetime
{
    private string _adminConnectionString = "";

    public string Name { get; } = "atlas_test_" + Guid.NewGuid().ToString("N")[..12];
    public string ConnectionString { get; private set; } = "";
    public NpgsqlDataSource DataSource { get; private set; } = null!;

    public async Task InitializeAsync()
    {
        _adminConnectionString = await AtlasDatabase.ResolveConnectionStringAsync();
        await using (var admin = new NpgsqlConnection(_adminConnectionString))
        {
            await admin.OpenAsync();
            await using var create = new NpgsqlCommand($"CREATE DATABASE {Name}", admin);
            await create.ExecuteNonQueryAsync();
        }
        ConnectionString = new NpgsqlConnectionStringBuilder(_adminConnectionString) { Database = Name }.ConnectionString;
        SchemaMigrator.Migrate(ConnectionString);
        DataSource = AtlasDatabase.CreateDataSource(ConnectionString);
    }

    public async Task DisposeAsync()
    {
        await DataSource.DisposeAsync();
        NpgsqlConnection.ClearAllPools();
        await using var admin = new NpgsqlConnection(_adminConnectionString);
        await admin.OpenAsync();
        await using var drop = new NpgsqlCommand($"DROP DATABASE IF EXISTS {Name} WITH (FORCE)", admin);
        await drop.ExecuteNonQueryAsync();
    }
}
