using Npgsql;

namespace Atlas.Storage.Tests;

public class ReadOnlyRoleMigrationTests
{
    // Roles are cluster-wide while migrations run per database: on a fresh cluster (no atlas_reader yet), four
    // databases migrated at the same moment must all succeed, and each must grant the one role SELECT only.
    [Fact]
    public async Task DatabasesMigratedConcurrentlyOnAFreshClusterAllGetTheOneReaderRole()
    {
        var home = Path.Combine(Path.GetTempPath(), "atlas-roles-" + Guid.NewGuid().ToString("N")[..8]);
        var cluster = new EmbeddedCluster(home, port: 55000 + Random.Shared.Next(0, 500));
        try
        {
            await cluster.EnsureRunningAsync();
            var names = Enumerable.Range(0, 4).Select(i => $"roles_{i}").ToArray();
            await using (var admin = new NpgsqlConnection(cluster.ConnectionString))
            {
                await admin.OpenAsync();
                foreach (var name in names)
                {
                    await using var create = new NpgsqlCommand($"CREATE DATABASE {name}", admin);
                    await create.ExecuteNonQueryAsync();
                }
            }
            var connections = names.Select(n => new NpgsqlConnectionStringBuilder(cluster.ConnectionString) { Database = n }.ConnectionString).ToArray();
            using var start = new Barrier(connections.Length);
            await Task.WhenAll(connections.Select(c => Task.Run(() =>
            {
                start.SignalAndWait();
                SchemaMigrator.Migrate(c);
            })));

            foreach (var connectionString in connections)
            {
                await using var connection = new NpgsqlConnection(connectionString);
                await connection.OpenAsync();
                await using var grants = new NpgsqlCommand("""
                    SELECT count(*) FILTER (WHERE has_table_privilege('atlas_reader', c.oid, 'SELECT')),
                           count(*) FILTER (WHERE has_table_privilege('atlas_reader', c.oid, 'INSERT, UPDATE, DELETE, TRUNCATE')),
                           count(*)
                      FROM pg_class c JOIN pg_namespace n ON n.oid = c.relnamespace
                     WHERE n.nspname = 'public' AND c.relkind IN ('r', 'p')
                    """, connection);
                await using var reader = await grants.ExecuteReaderAsync();
                await reader.ReadAsync();
                Assert.Equal(reader.GetInt64(2), reader.GetInt64(0));
                Assert.Equal(0L, reader.GetInt64(1));
            }
        }
        finally
        {
            NpgsqlConnection.ClearAllPools();
            try { cluster.Stop(); } catch (InvalidOperationException) { }
            Directory.Delete(home, recursive: true);
        }
    }
}
