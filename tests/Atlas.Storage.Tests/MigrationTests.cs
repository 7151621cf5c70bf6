using Atlas.TestSupport;
using Npgsql;

namespace Atlas.Storage.Tests;

public class MigrationTests(TestDatabase database) : IClassFixture<TestDatabase>
{
    [Fact]
    public async Task MigratingTwiceAppliesNothingAndLeavesTheSameSchema()
    {
        var before = await SchemaFingerprintAsync();
        var applied = SchemaMigrator.Migrate(database.ConnectionString);
        Assert.Equal(0, applied);
        Assert.Equal(before, await SchemaFingerprintAsync());
        var versions = await SchemaMigrator.AppliedVersionsAsync(database.DataSource);
        Assert.Equal(SchemaMigrator.AvailableMigrationCount, versions.Count);
    }

    [Fact]
    public async Task SchemaHasPostgisAndEveryPerCellTableKeyedByDatasetAndCellOrBlock()
    {
        await using var command = database.DataSource.CreateCommand("SELECT postgis_lib_version()");
        Assert.StartsWith("3.", (string)(await command.ExecuteScalarAsync())!);
        foreach (var table in Datasets.DatasetStore.PerCellTables.Where(t => t != "mesh_triangle"))
            Assert.StartsWith("dataset_id,cell_id", await PrimaryKeyAsync(table));
        Assert.Equal("dataset_id,parameter,period,block", await PrimaryKeyAsync(Datasets.DatasetStore.StatisticBlockTable));
        Assert.Equal("pass_id,dataset_id,parameter,period,block", await PrimaryKeyAsync(Datasets.DatasetStore.StatisticStageTable));
    }

    private async Task<string> PrimaryKeyAsync(string table)
    {
        await using var key = database.DataSource.CreateCommand("""
            SELECT string_agg(a.attname, ',' ORDER BY k.ord)
              FROM pg_index i CROSS JOIN LATERAL unnest(i.indkey) WITH ORDINALITY k(attnum, ord)
              JOIN pg_attribute a ON a.attrelid = i.indrelid AND a.attnum = k.attnum
             WHERE i.indrelid = $1::regclass AND i.indisprimary
            """);
        key.Parameters.AddWithValue(table);
        return (string)(await key.ExecuteScalarAsync())!;
    }

    private async Task<string> SchemaFingerprintAsync()
    {
        await using var command = database.DataSource.CreateCommand("""
            SELECT string_agg(table_name || '.' || column_name || ':' || data_type, ';' ORDER BY table_name, ordinal_position)
              FROM information_schema.columns WHERE table_schema = 'public'
            """);
        return (string)(await command.ExecuteScalarAsync())!;
    }
}
