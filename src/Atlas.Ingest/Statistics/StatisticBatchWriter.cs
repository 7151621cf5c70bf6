using System.Threading.Channels;
using Atlas.Ingest.Progress;

namespace Atlas.Ingest.Statistics;

/// <summary>
/// The write stage of a statistics pass: batches are stored by writers of their own (<paramref name="store"/>: the
/// StatisticsStore or a pass's staging table, binary COPY, one transaction per batch), so the calculators keep computing while PostgreSQL stores them, on several connections so
/// that one batch's COPY overlaps another's commit. Batches hold disjoint blocks, so their transactions never wait on
/// each other. A writer that fails cancels the whole pass.
/// </summary>
public sealed class StatisticBatchWriter(Func<StatisticBatch, CancellationToken, Task> store, int targetCells,
    IProgress<ProgressSnapshot>? progress, System.Diagnostics.Stopwatch clock)
{
    private int _done;

    /// <summary>Cells stored so far.</summary>
    public int CellsDone => Volatile.Read(ref _done);

    /// <summary>The running writers; started by <see cref="Start"/>.</summary>
    public Task[] Writers { get; private set; } = [];

    /// <summary>Starts <paramref name="connections"/> writers; the returned task completes when all have ended.</summary>
    public Task Start(ChannelReader<StatisticBatch> batches, int connections, CancellationTokenSource pass)
    {
        Writers = Enumerable.Range(0, connections).Select(_ => Task.Run(() => WriteAsync(batches, pass), pass.Token)).ToArray();
        return Task.WhenAll(Writers);
    }

    private async Task WriteAsync(ChannelReader<StatisticBatch> batches, CancellationTokenSource pass)
    {
        try
        {
            await foreach (var batch in batches.ReadAllAsync(pass.Token))
            {
                await store(batch, pass.Token);
                var cellsDone = Interlocked.Add(ref _done, batch.Cells.Count);
                progress?.Report(new ProgressSnapshot("statistics", cellsDone, targetCells, 0, clock.Elapsed, "cells"));
            }
        }
        catch
        {
            await pass.CancelAsync();
            throw;
        }
    }
}
