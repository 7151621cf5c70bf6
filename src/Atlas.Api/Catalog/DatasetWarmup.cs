namespace Atlas.Api.Catalog;

/// <summary>
/// Loads each dataset's cell table, nearest-cell index, extent, spacing and time lines into memory once the server
/// has started, so that the first point request after a start does not wait seconds for them on a large dataset.
/// Runs in the background; a failure (the database not up yet, say) is logged and the requests load what they need.
/// </summary>
public sealed partial class DatasetWarmup(DatasetStore datasets, DatasetCatalog catalog, ILogger<DatasetWarmup> logger) : BackgroundService
{
    protected override async Task ExecuteAsync(CancellationToken stoppingToken)
    {
        await Task.Yield();
        try
        {
            var list = await datasets.ListAsync(stoppingToken);
            foreach (var dataset in list)
            {
                await catalog.WetCellsAsync(dataset, stoppingToken);
                await catalog.ExtentAsync(dataset, stoppingToken);
                await catalog.TypicalSpacingMetresAsync(dataset, stoppingToken);
                await catalog.TimelinesAsync(dataset, stoppingToken);
            }
            DatasetsWarmed(logger, list.Count);
        }
        catch (OperationCanceledException) when (stoppingToken.IsCancellationRequested)
        {
        }
        catch (Exception e)
        {
            WarmupFailed(logger, e);
        }
    }

    [LoggerMessage(EventId = 11, Level = LogLevel.Information, Message = "Cell tables and time lines of {Count} dataset(s) loaded into memory")]
    private static partial void DatasetsWarmed(ILogger logger, int count);

    [LoggerMessage(EventId = 12, Level = LogLevel.Warning, Message = "Datasets could not be loaded into memory at start-up; requests will load them")]
    private static partial void WarmupFailed(ILogger logger, Exception exception);
}
