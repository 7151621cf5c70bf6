using Npgsql;

namespace Atlas.Storage.Tests;

public class EmbeddedClusterTests
{
    // The whole life cycle in a throw-away home on its own port: create, start, migrate, stop, start again.
    [Fact]
    public async Task ClusterIsCreatedStartedMigratedStoppedAndRestartedWithItsData()
    {
        var home = Path.Combine(Path.GetTempPath(), "atlas-cluster-" + Guid.NewGuid().ToString("N")[..8]);
        var cluster = new EmbeddedCluster(home, port: 54400 + Random.Shared.Next(0, 500));
        var other = home + "-other";
        try
        {
            Assert.False(cluster.IsCreated);
            await cluster.EnsureRunningAsync();
            Assert.True(cluster.IsRunning());
            await cluster.EnsureRunningAsync();  // running with its database: answered by one connection

            // Another home on the same port is not answered by this cluster (its data directory differs): it is
            // started as its own, and as its home holds no real cluster, that fails and says so.
            Directory.CreateDirectory(Path.Combine(other, "pg"));
            File.WriteAllText(Path.Combine(other, "pg", "PG_VERSION"), "15\n");
            await Assert.ThrowsAsync<InvalidOperationException>(() => new EmbeddedCluster(other, cluster.Port).EnsureRunningAsync());
            Assert.Equal(1, SchemaMigrator.Migrate(cluster.ConnectionString) > 0 ? 1 : 0);
            await using (var connection = new NpgsqlConnection(cluster.ConnectionString))
            {
                await connection.OpenAsync();
                await using var insert = new NpgsqlCommand(
                    "INSERT INTO dataset (slug, title, grid_kind, point_count) VALUES ('kept', 'kept', 'regular', 1)", connection);
                await insert.ExecuteNonQueryAsync();
            }
            NpgsqlConnection.ClearAllPools();
            cluster.Stop();
            Assert.False(cluster.IsRunning());
            Assert.Contains("stopped", cluster.Describe());
            await cluster.EnsureRunningAsync();
            Assert.Equal(0, SchemaMigrator.Migrate(cluster.ConnectionString));
            await using (var connection = new NpgsqlConnection(cluster.ConnectionString))
            {
                await connection.OpenAsync();
                await using var count = new NpgsqlCommand("SELECT count(*) FROM dataset WHERE slug = 'kept'", connection);
                Assert.Equal(1L, await count.ExecuteScalarAsync());
            }
        }
        finally
        {
            NpgsqlConnection.ClearAllPools();
            try { cluster.Stop(); } catch (InvalidOperationException) { }
            Directory.Delete(home, recursive: true);
            if (Directory.Exists(other)) Directory.Delete(other, recursive: true);
        }
    }
}
