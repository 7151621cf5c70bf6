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

    // Two processes starting together (two workers of one pass): the second waits in PostgreSQL's lock queue for the
    // first's migration, seen in pg_locks as an advisory lock not granted (PostgreSQL documentation, "Viewing Locks"),
    // and goes on when it is released, instead of sleeping out a retry interval.
    [Fact]
    public async Task AMigrationStartedWhileAnotherRunsWaitsInTheLockQueue()
    {
        await using var holder = new NpgsqlConnection(database.ConnectionString);
        await holder.OpenAsync();
        await using (var take = new NpgsqlCommand($"SELECT pg_advisory_lock({SchemaMigrator.GateKeySql})", holder))
            await take.ExecuteNonQueryAsync();
        var second = Task.Run(() => SchemaMigrator.Migrate(database.ConnectionString));
        var waiting = false;
        for (int i = 0; i < 600 && !waiting && !second.IsCompleted; i++)
        {
            await using var look = database.DataSource.CreateCommand(
                $"SELECT EXISTS (SELECT 1 FROM pg_locks WHERE locktype = 'advisory' AND NOT granted AND objid = ({SchemaMigrator.GateKeySql})::oid)");
            waiting = (bool)(await look.ExecuteScalarAsync())!;
            if (!waiting) await Task.Delay(50);
        }
        Assert.True(waiting, "the second migration is not queued on the gate lock");
        Assert.False(second.IsCompleted);
        await using (var release = new NpgsqlCommand($"SELECT pg_advisory_unlock({SchemaMigrator.GateKeySql})", holder))
            await release.ExecuteNonQueryAsync();
        Assert.Equal(0, await second);
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
