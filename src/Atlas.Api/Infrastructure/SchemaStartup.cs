using Atlas.Storage;

namespace Atlas.Api.Infrastructure;

/// <summary>Applies pending schema migrations when the server starts; a failure is logged and /readyz reports it.</summary>
public sealed class SchemaStartup(DatabaseConnectionString connection, ILogger<SchemaStartup> logger) : IHostedService
{
    public Task StartAsync(CancellationToken cancel)
    {
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
