namespace Atlas.Api.Data;

/// <summary>
/// Applies pending schema migrations when the server starts; a failure is logged and /readyz reports it. Taking both
/// connection strings here resolves them at start-up, so a malformed one stops the server at once with its name.
/// </summary>
public sealed partial class SchemaStartup(DatabaseConnectionString connection, ReadConnectionString read, ILogger<SchemaStartup> logger) : IHostedService
{
    public Task StartAsync(CancellationToken cancel)
    {
        ReadConnection(logger, read.Value is null ? "the writer's connection" : "a connection of their own (ConnectionStrings:AtlasRead or ATLAS_DB_READ)");
        try
        {
            var applied = SchemaMigrator.Migrate(connection.Value);
            MigrationsApplied(logger, applied);
        }
        catch (Exception e)
        {
            MigrationsFailed(logger, e);
        }
        return Task.CompletedTask;
    }

    public Task StopAsync(CancellationToken cancel) => Task.CompletedTask;

    [LoggerMessage(EventId = 3, Level = LogLevel.Information, Message = "Schema migrations applied at start-up: {Count}")]
    private static partial void MigrationsApplied(ILogger logger, int count);

    [LoggerMessage(EventId = 4, Level = LogLevel.Warning, Message = "Schema migrations could not be applied at start-up; /readyz reports not ready")]
    private static partial void MigrationsFailed(ILogger logger, Exception exception);

    [LoggerMessage(EventId = 10, Level = LogLevel.Information, Message = "Read endpoints use {Connection}")]
    private static partial void ReadConnection(ILogger logger, string connection);
}

/// <summary>The connection string the process resolved once at start-up.</summary>
public sealed record DatabaseConnectionString(string Value);
