using Npgsql;

namespace Atlas.Storage;

/// <summary>
/// The database a command was pointed at cannot be used at all: no server answers, or it refuses the connection (no
/// such database, no such role, a wrong password). Says which database, as whom, why, and what to set.
/// </summary>
public sealed class DatabaseUnreachableException(string message, Exception inner) : Exception(message, inner)
{
    /// <summary>Exit status of a command that could not reach its database (2 is a refused input).</summary>
    public const int ExitCode = 3;

    /// <summary>The failure of a first connection, as a user reads it; null when <paramref name="failure"/> is another kind.</summary>
    public static DatabaseUnreachableException? From(Exception failure, string connectionString)
    {
        var reason = failure switch
        {
            PostgresException p => $"{p.MessageText} (SQLSTATE {p.SqlState})",
            NpgsqlException n => n.InnerException is { } cause ? $"{n.Message}: {cause.Message}" : n.Message,
            _ => null,
        };
        if (reason is null) return null;
        var target = new NpgsqlConnectionStringBuilder(connectionString);
        var where = $"database '{target.Database}' on {target.Host}:{target.Port} as '{target.Username}'";
        var advice = AtlasDatabase.ConfiguredConnectionString is null
            ? "The embedded cluster is used because ATLAS_DB is not set: 'atlas db status' shows its state."
            : "ATLAS_DB names it: set ATLAS_DB to a database that exists and accepts this role, or unset it to use the embedded cluster ('atlas db start').";
        return new DatabaseUnreachableException($"cannot use the {where}: {reason}. {advice}", failure);
    }
}
