using System.CommandLine;
using Atlas.Storage;

namespace Atlas.Cli.Commands;

/// <summary><c>atlas db start|stop|status|migrate</c>: the embedded cluster's life cycle and the schema.</summary>
public static class DatabaseCommands
{
    public static Command Build()
    {
        var db = new Command("db", "Manage the database: the embedded cluster (when ATLAS_DB is not set) and the schema.");

        var start = new Command("start", "Create (first time) and start the embedded PostgreSQL + PostGIS cluster, then migrate.");
        start.SetAction(async (_, cancel) =>
        {
            if (AtlasDatabase.ConfiguredConnectionString is not null)
            {
                Console.WriteLine("ATLAS_DB is set: using that server; there is no embedded cluster to start.");
                return 0;
            }
            var cluster = AtlasDatabase.EmbeddedCluster();
            await cluster.EnsureRunningAsync(cancel);
            var applied = SchemaMigrator.Migrate(cluster.ConnectionString);
            Console.WriteLine($"{cluster.Describe()}; {applied} migration(s) applied");
            return 0;
        });

        var stop = new Command("stop", "Stop the embedded cluster (its data stays).");
        stop.SetAction(_ =>
        {
            var cluster = AtlasDatabase.EmbeddedCluster();
            cluster.Stop();
            Console.WriteLine(cluster.Describe());
            return 0;
        });

        var status = new Command("status", "Say which database is used, whether it is up, and which migrations are applied.");
        status.SetAction(async (_, cancel) =>
        {
            string connectionString;
            if (AtlasDatabase.ConfiguredConnectionString is { } configured)
            {
                Console.WriteLine("database: ATLAS_DB (external server)");
                connectionString = configured;
            }
            else
            {
                var cluster = AtlasDatabase.EmbeddedCluster();
                Console.WriteLine(cluster.Describe());
                if (!cluster.IsRunning()) return 3;
                connectionString = cluster.ConnectionString;
            }
            await using var dataSource = AtlasDatabase.CreateDataSource(connectionString);
            try
            {
                await using var version = dataSource.CreateCommand("SELECT version(), postgis_lib_version()");
                await using var reader = await version.ExecuteReaderAsync(cancel);
                await reader.ReadAsync(cancel);
                Console.WriteLine($"server: {reader.GetString(0).Split(',')[0]}; PostGIS {reader.GetString(1)}");
            }
            catch (Npgsql.PostgresException e) when (e.SqlState == Npgsql.PostgresErrorCodes.UndefinedFunction)
            {
                Console.WriteLine("server: reachable; PostGIS not yet installed in the database (run atlas db migrate)");
            }
            var applied = await SchemaMigrator.AppliedVersionsAsync(dataSource, cancel);
            Console.WriteLine($"schema: {applied.Count} of {SchemaMigrator.AvailableMigrationCount} migration(s) applied" +
                (applied.Count > 0 ? $" (latest V{applied[^1]})" : ""));
            return 0;
        });

        var migrate = new Command("migrate", "Apply pending schema migrations (safe to re-run).");
        migrate.SetAction(async (_, cancel) =>
        {
            var connectionString = await AtlasDatabase.ResolveConnectionStringAsync(cancel);
            var applied = SchemaMigrator.Migrate(connectionString);
            Console.WriteLine($"{applied} migration(s) applied");
            return 0;
        });

        db.Subcommands.Add(start);
        db.Subcommands.Add(stop);
        db.Subcommands.Add(status);
        db.Subcommands.Add(migrate);
        return db;
    }
}
