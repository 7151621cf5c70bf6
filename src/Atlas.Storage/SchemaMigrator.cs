using Npgsql;

namespace Atlas.Storage;

/// <summary>
/// Applies the SQL migrations under db/ (copied beside the binaries) in version order with Evolve, which records
/// each applied script and its checksum in the table <c>atlas_migration_ledger</c>; re-running applies nothing new.
/// A database migrated before the ledger had that name keeps its record: the former table is renamed first.
/// </summary>
public static class SchemaMigrator
{
    public const string HistoryTable = "atlas_migration_ledger";

    /// <summary>The ledger's name before, renamed to <see cref="HistoryTable"/> at the next start.</summary>
    public const string FormerHistoryTable = "atlas_schema_history";

    public static string MigrationsFolder =>
        Environment.GetEnvironmentVariable("ATLAS_MIGRATIONS") is { Length: > 0 } configured
            ? configured
            : Path.Combine(AppContext.BaseDirectory, "db");

    /// <summary>
    /// Applies pending migrations, up to <paramref name="targetVersion"/> when given (for tests of a migration on data
    /// stored by the schema before it); returns the number applied. The scripts are those of <paramref name="folder"/>,
    /// by default <see cref="MigrationsFolder"/>.
    /// </summary>
    public static int Migrate(string connectionString, Action<string>? log = null, string? targetVersion = null, string? folder = null)
    {
        folder ??= MigrationsFolder;
        if (!Directory.Exists(folder) || Directory.GetFiles(folder, "*.sql").Length == 0)
            throw new InvalidOperationException($"No migrations found in {folder}.");
        using var gate = new NpgsqlConnection(connectionString);
        gate.Open();
        // Every script already applied, unchanged: nothing for Evolve to do (every command starts with this look).
        if (targetVersion is null && EveryScriptApplied(gate, folder)) return 0;
        // Processes starting together (workers of one pass) queue on this lock and go on as soon as the one before has
        // migrated, instead of meeting Evolve's own lock, whose retry sleeps for seconds.
        using (var take = new NpgsqlCommand($"SELECT pg_advisory_lock({GateKeySql})", gate)) take.ExecuteNonQuery();
        try
        {
            return MigrateHoldingTheGate(connectionString, log, targetVersion, folder);
        }
        finally
        {
            using var release = new NpgsqlCommand($"SELECT pg_advisory_unlock({GateKeySql})", gate);
            release.ExecuteNonQuery();
        }
    }

    /// <summary>
    /// Whether every migration script of <see cref="MigrationsFolder"/> is applied, unchanged, as seen on
    /// <paramref name="connection"/> (of the data source a command goes on with, so that a command on an up-to-date
    /// database opens and loads the database's types once, not once for the look and again for the work).
    /// </summary>
    public static bool IsUpToDate(NpgsqlConnection connection)
    {
        var folder = MigrationsFolder;
        return Directory.Exists(folder) && Directory.GetFiles(folder, "*.sql").Length > 0 && EveryScriptApplied(connection, folder);
    }

    /// <summary>
    /// Whether the ledger records every script of the folder as applied with the checksum Evolve gives it (the MD5 of
    /// its bytes) and nothing else; anything else (no ledger, a new, changed or unknown script, a repeatable one) is
    /// left to Evolve, which applies, or refuses with its own message.
    /// </summary>
    private static bool EveryScriptApplied(NpgsqlConnection connection, string folder)
    {
        var files = Directory.GetFiles(folder, "*.sql");
        if (files.Any(f => !Path.GetFileName(f).StartsWith('V'))) return false;
        var applied = new Dictionary<string, string>(StringComparer.Ordinal);
        try
        {
            using var command = new NpgsqlCommand($"SELECT name, checksum FROM {HistoryTable} WHERE success AND type = 0", connection);
            using var reader = command.ExecuteReader();
            while (reader.Read()) applied[reader.GetString(0)] = reader.GetString(1);
        }
        catch (PostgresException e) when (e.SqlState == PostgresErrorCodes.UndefinedTable)
        {
            return false;
        }
        return applied.Count == files.Length && files.All(f =>
            applied.TryGetValue(Path.GetFileName(f), out var checksum) &&
            string.Equals(checksum, Convert.ToHexString(System.Security.Cryptography.MD5.HashData(File.ReadAllBytes(f))), StringComparison.OrdinalIgnoreCase));
    }

    /// <summary>The advisory lock that every atlas process takes (waiting, not polling) around its migration.</summary>
    public const string GateKeySql = "hashtext('atlas schema migration gate')";

    private static int MigrateHoldingTheGate(string connectionString, Action<string>? log, string? targetVersion, string folder)
    {
        MoveFormerLedger(connectionString, log);
        using var connection = new NpgsqlConnection(connectionString);
        var evolve = new EvolveDb.Evolve(connection, message => log?.Invoke(message))
        {
            Locations = [folder],
            MetadataTableName = HistoryTable,
            IsEraseDisabled = true,
            EnableClusterMode = true,
            CommandTimeout = 600,
        };
        if (targetVersion is not null) evolve.TargetVersion = new EvolveDb.Migration.MigrationVersion(targetVersion);
        evolve.Migrate();
        return evolve.NbMigration;
    }

    /// <summary>
    /// Renames the former ledger table (with its id sequence and primary key, as Evolve names them) to the current
    /// name, in one transaction under an advisory lock so that two processes starting together do it once; does
    /// nothing when there is no former table or the current one already exists (then the former is left alone for
    /// a person to look at, and logged).
    /// </summary>
    private static void MoveFormerLedger(string connectionString, Action<string>? log)
    {
        using var connection = new NpgsqlConnection(connectionString);
        connection.Open();
        using var transaction = connection.BeginTransaction();
        using (var lockLedger = new NpgsqlCommand("SELECT pg_advisory_xact_lock(hashtext('atlas migration ledger'))", connection, transaction))
            lockLedger.ExecuteNonQuery();
        using var state = new NpgsqlCommand("SELECT to_regclass($1) IS NOT NULL, to_regclass($2) IS NOT NULL", connection, transaction);
        state.Parameters.AddWithValue(FormerHistoryTable);
        state.Parameters.AddWithValue(HistoryTable);
        bool former, current;
        using (var reader = state.ExecuteReader())
        {
            reader.Read();
            (former, current) = (reader.GetBoolean(0), reader.GetBoolean(1));
        }
        if (former && current)
            log?.Invoke($"Both {FormerHistoryTable} and {HistoryTable} exist; {HistoryTable} is used and {FormerHistoryTable} is left as it is.");
        if (former && !current)
        {
            using var rename = new NpgsqlCommand($"""
                ALTER TABLE {FormerHistoryTable} RENAME TO {HistoryTable};
                ALTER SEQUENCE IF EXISTS {FormerHistoryTable}_id_seq RENAME TO {HistoryTable}_id_seq;
                ALTER INDEX IF EXISTS {FormerHistoryTable}_pkey RENAME TO {HistoryTable}_pkey;
                """, connection, transaction);
            rename.ExecuteNonQuery();
            log?.Invoke($"Renamed the migration ledger {FormerHistoryTable} to {HistoryTable}.");
        }
        transaction.Commit();
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
