using Npgsql;

namespace Atlas.Storage;

/// <summary>
/// Applies the SQL migrations under db/ (copied beside the binaries) in version order with Evolve, which records
/// each applied script and its checksum in the table <c>atlas_schema_history</c>; re-running applies nothing new.
/// </summary>
public static class SchemaMigrator
{
    public const string HistoryTable = "atlas_schema_history";

    public static string MigrationsFolder =>
        Environment.GetEnvironmentVariable("ATLAS_MIGRATIONS") is { Length: > 0 } configured
            ? configured
            : Path.Combine(AppContext.BaseDirectory, "db");

    /// <summary>
    /// Applies pending migrations, up to <paramref name="targetVersion"/> when given (for tests of a migration on data
    /// stored by the schema before it); returns the number applied.
    /// </summary>
    public static int Migrate(string connectionString, Action<string>? log = null, string? targetVersion = null)
    {
        if (!Directory.Exists(MigrationsFolder) || Directory.GetFiles(MigrationsFolder, "*.sql").Length == 0)
            throw new InvalidOperationException($"No migrations found in {MigrationsFolder}.");
        using var connection = new NpgsqlConnection(connectionString);
        var evolve = new EvolveDb.Evolve(connection, message => log?.Invoke(message))
        {
            Locations = [MigrationsFolder],
            MetadataTableName = HistoryTable,
            IsEraseDisabled = true,
            EnableClusterMode = true,
            CommandTimeout = 600,
        };
        if (targetVersion is not null) evolve.TargetVersion = new EvolveDb.Migration.MigrationVersion(targetVersion);
        evolve.Migrate();
        return evolve.NbMigration;
    }

    /// <summary>The versions recorded as applied, oldest first.</summary>
    public static async Task<IReadOnlyList<string>> AppliedVersionsAsync(NpgsqlDataSource dataSource, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand(
            $"SELECT version FROM {HistoryTable} WHERE success AND type = 0 ORDER BY id");
        var versions = new List<string>();
        try
        {
            await using var reader = await command.ExecuteReaderAsync(cancel);
            while (await reader.ReadAsync(cancel)) versions.Add(reader.GetString(0));
        }
        catch (PostgresException e) when (e.SqlState == PostgresErrorCodes.UndefinedTable)
        {
        }
        return versions;
    }

    public static int AvailableMigrationCount =>
        Directory.Exists(MigrationsFolder) ? Directory.GetFiles(MigrationsFolder, "V*.sql").Length : 0;
}
