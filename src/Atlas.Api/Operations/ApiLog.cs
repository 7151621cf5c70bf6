namespace Atlas.Api.Operations;

/// <summary>The API's log messages.</summary>
public static partial class ApiLog
{
    [LoggerMessage(EventId = 1, Level = LogLevel.Warning, Message = "Database unavailable while serving {Path}")]
    public static partial void DatabaseUnavailable(ILogger logger, string path, Exception exception);

    [LoggerMessage(EventId = 2, Level = LogLevel.Error, Message = "Unhandled error while serving {Path}")]
    public static partial void UnhandledError(ILogger logger, string path, Exception exception);

    [LoggerMessage(EventId = 3, Level = LogLevel.Information, Message = "Schema migrations applied at start-up: {Count}")]
    public static partial void MigrationsApplied(ILogger logger, int count);

    [LoggerMessage(EventId = 4, Level = LogLevel.Warning, Message = "Schema migrations could not be applied at start-up; /readyz reports not ready")]
    public static partial void MigrationsFailed(ILogger logger, Exception exception);

    [LoggerMessage(EventId = 5, Level = LogLevel.Information, Message = "Serving the map page from {Folder}")]
    public static partial void ServingWebRoot(ILogger logger, string folder);

    [LoggerMessage(EventId = 6, Level = LogLevel.Warning, Message = "No map page folder found (looked for {Folder}); only the API is served")]
    public static partial void NoWebRoot(ILogger logger, string folder);

    [LoggerMessage(EventId = 7, Level = LogLevel.Information, Message = "Dataset {Slug} deleted through the API")]
    public static partial void DatasetDeleted(ILogger logger, string slug);

    [LoggerMessage(EventId = 8, Level = LogLevel.Information, Message = "Statistics job {JobId} queued for {Slug} through the API")]
    public static partial void JobQueued(ILogger logger, long jobId, string slug);

    [LoggerMessage(EventId = 9, Level = LogLevel.Warning, Message = "The job queue could not be read for the metrics scrape: {Error}")]
    public static partial void JobQueueUnreadable(ILogger logger, string error);

    [LoggerMessage(EventId = 10, Level = LogLevel.Information, Message = "Read endpoints use {Connection}")]
    public static partial void ReadConnection(ILogger logger, string connection);

    [LoggerMessage(EventId = 11, Level = LogLevel.Information, Message = "Cell tables and time lines of {Count} dataset(s) loaded into memory")]
    public static partial void DatasetsWarmed(ILogger logger, int count);

    [LoggerMessage(EventId = 12, Level = LogLevel.Warning, Message = "Datasets could not be loaded into memory at start-up; requests will load them")]
    public static partial void WarmupFailed(ILogger logger, Exception exception);
}
