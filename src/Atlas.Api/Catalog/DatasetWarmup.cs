using Microsoft.AspNetCore.Http.Json;

namespace Atlas.Api.Catalog;

/// <summary>
/// Loads each dataset's cell table, nearest-cell index, extent, spacing and time lines into memory as the server starts,
/// and answers one point of each dataset once (not kept), so that the first point request after a start finds the cell
/// table of a large dataset loaded and the point path compiled instead of waiting a second or more for both. The server
/// starts listening once this is done, or after <see cref="WaitAtStart"/> at most (the loads then go on in the
/// background and requests share them). A failure (the database not up yet, say) is logged and the requests load what
/// they need.
/// </summary>
public sealed partial class DatasetWarmup(DatasetStore datasets, DatasetCatalog catalog, PointLocator locator, PointStatisticsService statistics,
    IOptions<JsonOptions> json, ILogger<DatasetWarmup> logger) : IHostedService
{
    /// <summary>The longest the start waits for the warm-up before the server listens anyway.</summary>
    public static readonly TimeSpan WaitAtStart = TimeSpan.FromSeconds(20);

    // Never disposed: it has no timer, and a host may stop its services after the container disposed them (a test host
    // that failed to start, say), when a disposed source would throw.
    private readonly CancellationTokenSource _stopping = new();
    private Task _warming = Task.CompletedTask;

    public async Task StartAsync(CancellationToken cancel)
    {
        _warming = Task.Run(() => WarmAsync(_stopping.Token), CancellationToken.None);
        try
        {
            await _warming.WaitAsync(WaitAtStart, cancel);
        }
        catch (TimeoutException)
        {
            StillWarming(logger, WaitAtStart.TotalSeconds);
        }
    }

    public async Task StopAsync(CancellationToken cancel)
    {
        await _stopping.CancelAsync();
        await _warming.WaitAsync(cancel).ConfigureAwait(ConfigureAwaitOptions.SuppressThrowing);
    }

    private async Task WarmAsync(CancellationToken stopping)
    {
        try
        {
            var list = await datasets.ListAsync(stopping);
            // Independent loads side by side, two datasets at a time (the database has cores to spare for that much): the
            // cell table and index, the extent, the spacing, the time lines. The largest datasets first: they take longest.
            await Parallel.ForEachAsync(list.OrderByDescending(d => d.PointCount), new ParallelOptions { MaxDegreeOfParallelism = 2, CancellationToken = stopping },
                async (dataset, token) => await Task.WhenAll(catalog.WetCellsAsync(dataset, token), catalog.ExtentAsync(dataset, token),
                    catalog.TypicalSpacingMetresAsync(dataset, token), catalog.TimelinesAsync(dataset, token)));
            DatasetsWarmed(logger, list.Count);
            foreach (var dataset in list)
                if (await AnswerOnePointAsync(dataset, stopping)) break;
        }
        catch (OperationCanceledException) when (stopping.IsCancellationRequested)
        {
        }
        catch (Exception e)
        {
            WarmupFailed(logger, e);
        }
    }

    /// <summary>The point answer (every part, JSON) of the dataset's first wet cell, made and dropped: the point path is then compiled.</summary>
    private async Task<bool> AnswerOnePointAsync(DatasetRecord dataset, CancellationToken stopping)
    {
        var first = (await catalog.CellsAsync(dataset, stopping)).All.FirstOrDefault(c => c.Wet);
        if (first is null) return false;
        var (point, _) = await locator.LocateAsync(dataset.Slug, first.Latitude, first.Longitude, stopping);
        if (point is null) return false;
        var (analysis, _) = await statistics.AnalyseAsync(point, new YearWindow(null, null, null), null, stopping);
        if (analysis is null) return false;
        JsonSerializer.SerializeToUtf8Bytes(PointStatisticsService.Statistics(analysis, PointStatisticsQuery.Parts.ToHashSet()), json.Value.SerializerOptions);
        return true;
    }

    [LoggerMessage(EventId = 11, Level = LogLevel.Information, Message = "Cell tables and time lines of {Count} dataset(s) loaded into memory")]
    private static partial void DatasetsWarmed(ILogger logger, int count);

    [LoggerMessage(EventId = 12, Level = LogLevel.Warning, Message = "Datasets could not be loaded into memory at start-up; requests will load them")]
    private static partial void WarmupFailed(ILogger logger, Exception exception);

    [LoggerMessage(EventId = 13, Level = LogLevel.Information, Message = "Datasets still loading after {Seconds} s; the server listens and requests share the loads")]
    private static partial void StillWarming(ILogger logger, double seconds);
}
