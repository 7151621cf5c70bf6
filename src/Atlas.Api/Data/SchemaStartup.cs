using Atlas.Api.Operations;
using Atlas.Storage;

namespace Atlas.Api.Data;

/// <summary>
/// Applies pending schema migrations when the server starts; a failure is logged and /readyz reports it. Taking both
/// connection strings here resolves them at start-up, so a malformed one stops the server at once with its name.
/// </summary>
public sealed class SchemaStartup(DatabaseConnectionString connection, ReadConnectionString read, ILogger<SchemaStartup> logger) : IHostedService
{
    public Task StartAsync(CancellationToken cancel)
    {
        ApiLog.ReadConnection(logger, read.Value is null ? "the writer's connection" : "a connection of their own (ConnectionStrings:AtlasRead or ATLAS_DB_READ)");
        try
        {
            var applied = SchemaMigrator.Migrate(connection.Value);
            ApiLog.MigrationsApplied(logger, applied);
        }
        catch (Exception e)
        {
            ApiLog.MigrationsFailed(logger, e);
        }
        return Task.CompletedTask;
    }

    public Task StopAsync(CancellationToken cancel) => Task.CompletedTask;
}

/// <summary>The connection string the process resolved once at start-up.</summary>
public sealed record DatabaseConnectionString(string Value);
