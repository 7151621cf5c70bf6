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

    // A nearest-cell search names one dataset: the index it runs on is led by the dataset id, so the search goes
    // straight to that dataset's cells (where datasets overlap, an index over all of them walked the others' cells).
    // PostgreSQL's own EXPLAIN names the index, its condition and the distance ordering it serves.
    [Theory]
    [InlineData("wet", "cell_wet_dataset_geom_idx")]
    [InlineData("NOT wet", "cell_dry_dataset_geom_idx")]
    public async Task NearestCellSearchesRunOnAnIndexLedByTheDataset(string which, string index)
    {
        await using var connection = await database.DataSource.OpenConnectionAsync();
        await using (var off = new NpgsqlCommand("SET enable_seqscan = off", connection)) await off.ExecuteNonQueryAsync();
        await using var explain = new NpgsqlCommand(
            $"EXPLAIN (FORMAT JSON) SELECT cell_id FROM cell WHERE dataset_id = $1 AND {which} ORDER BY geom <-> ST_SetSRID(ST_MakePoint(-20, 50), 4326) LIMIT 1",
            connection);
        explain.Parameters.AddWithValue(7);
        var plan = (string)(await explain.ExecuteScalarAsync())!;
        Assert.Contains($"\"Index Name\": \"{index}\"", plan);
        Assert.Contains("\"Index Cond\": \"(dataset_id = 7)\"", plan);
        Assert.Contains("\"Order By\": \"(geom <->", plan);
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
