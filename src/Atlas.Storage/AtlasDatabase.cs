using Npgsql;

namespace Atlas.Storage;

/// <summary>
/// Chooses the database: the server named by the ATLAS_DB connection string, or else the embedded cluster,
/// started (and created) on demand. Builds the one <see cref="NpgsqlDataSource"/> the process uses.
/// </summary>
public static class AtlasDatabase
{
    public const string ConnectionVariable = "ATLAS_DB";

    public static string? ConfiguredConnectionString =>
        Environment.GetEnvironmentVariable(ConnectionVariable) is { Length: > 0 } s ? s : null;

    /// <summary>The embedded cluster of this home, on the port ATLAS_PG_PORT names (default 54329).</summary>
    public static EmbeddedCluster EmbeddedCluster() => new(AtlasHome.Resolve(), EmbeddedPort());

    /// <summary>ATLAS_PG_PORT, refused with its value when it is not a port number (rather than silently ignored).</summary>
    public static int EmbeddedPort()
    {
        var configured = Environment.GetEnvironmentVariable("ATLAS_PG_PORT");
        if (string.IsNullOrWhiteSpace(configured)) return Storage.EmbeddedCluster.DefaultPort;
        if (int.TryParse(configured, System.Globalization.NumberStyles.None, System.Globalization.CultureInfo.InvariantCulture, out var port) && port is >= 1024 and <= 65535)
            return port;
        throw new InvalidOperationException($"ATLAS_PG_PORT is '{configured}', which is not a port number from 1024 to 65535.");
    }

    /// <summary>The connection string to use, starting the embedded cluster first when none is configured.</summary>
    public static async Task<string> ResolveConnectionStringAsync(CancellationToken cancel = default)
    {
        if (ConfiguredConnectionString is { } configured) return configured;
        var cluster = EmbeddedCluster();
        await cluster.EnsureRunningAsync(cancel);
        return cluster.ConnectionString;
    }

    public static NpgsqlDataSource CreateDataSource(string connectionString)
    {
        var builder = new NpgsqlDataSourceBuilder(connectionString);
        builder.UseNetTopologySuite();
        builder.ConnectionStringBuilder.ApplicationName ??= "atlas";
        // Every query here is short or streams rows; compiling it to machine code first (PostgreSQL's JIT, on by
        // default) costs a tenth of a second on the queries large enough to trigger it and gains nothing.
        if (builder.ConnectionStringBuilder.Options?.Contains("jit", StringComparison.Ordinal) != true)
            builder.ConnectionStringBuilder.Options = ((builder.ConnectionStringBuilder.Options ?? "") + " -c jit=off").Trim();
        return builder.Build();
    }

    /// <summary>
    /// Resolves the database, applies pending migrations, and returns a data source for it. Where every migration is
    /// applied already (every command but the first on a database), the look is made on the data source returned, so
    /// that the command connects and loads the database's types once (each data source does on its first connection:
    /// a command had spent 50-90 ms doing it twice).
    /// </summary>
    public static async Task<NpgsqlDataSource> OpenMigratedAsync(Action<string>? log = null, CancellationToken cancel = default)
    {
        var connectionString = await ResolveConnectionStringAsync(cancel);
        var dataSource = CreateDataSource(connectionString);
        bool upToDate;
        try
        {
            await using var connection = await dataSource.OpenConnectionAsync(cancel);
            upToDate = SchemaMigrator.IsUpToDate(connection);
        }
        catch (Exception e) when (DatabaseUnreachableException.From(e, connectionString) is { } unreachable)
        {
            await dataSource.DisposeAsync();
            throw unreachable;
        }
        if (upToDate) return dataSource;
        // Migrations to apply: through the migrator's own connections, then a data source that loads the types they made.
        await dataSource.DisposeAsync();
        SchemaMigrator.Migrate(connectionString, log);
        return CreateDataSource(connectionString);
    }
}
