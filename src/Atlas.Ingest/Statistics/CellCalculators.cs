using System.Threading.Channels;
using Atlas.Statistics;
using Atlas.Storage.Statistics;

namespace Atlas.Ingest.Statistics;

/// <summary>A cell's statistics as stored rows (<see cref="StatisticRows"/>).</summary>
public sealed record CellResult(int CellId, List<StatisticRow> Rows);

/// <summary>
/// The calculate stage of a statistics pass: one <see cref="BinnedCellCalculator"/> per worker, each taking cell
/// series as they come, computing every period, and returning the series buffer to the free pool at once. The results
/// channel is completed when every worker has ended (with the first error, if one failed).
/// </summary>
public sealed class CellCalculators(StatisticsOptions options, long[] times, int workers)
{
    /// <summary>
    /// At output points of spectra: each (cell, period)'s directionality coefficient from the period-mean directionally
    /// resolved power of its spectra, which replaces the one modelled from direction and spread in the stored d row.
    /// </summary>
    public IReadOnlyDictionary<(int Cell, AtlasPeriod Period), double>? SpectralDirectionality { get; init; }

    /// <summary>Where the lists of rows come from; the assembler gives them back.</summary>
    public RowListPool RowLists { get; init; } = new();

    /// <summary>The running workers; started by <see cref="Start"/>.</summary>
    public Task[] Workers { get; private set; } = [];

    /// <summary>Starts the workers; the returned task completes <paramref name="results"/> once they have all ended.</summary>
    public Task Start(ChannelReader<CellSeriesBuffer> work, ChannelWriter<CellSeriesBuffer> free, ChannelWriter<CellResult> results, CancellationToken cancel)
    {
        Workers = Enumerable.Range(0, workers).Select(_ => Task.Run(() => CalculateAsync(work, free, results, cancel), cancel)).ToArray();
        return Task.WhenAll(Workers).ContinueWith(t => results.Complete(t.Exception), TaskScheduler.Default);
    }

    private async Task CalculateAsync(ChannelReader<CellSeriesBuffer> work, ChannelWriter<CellSeriesBuffer> free, ChannelWriter<CellResult> results,
        CancellationToken cancel)
    {
        var calculator = new BinnedCellCalculator(options);
        var statistics = new BinnedCellResults();
        await foreach (var buffer in work.ReadAllAsync(cancel))
        {
            var rows = RowLists.Rent();
            calculator.Compute(buffer.AsSeries(times), statistics);
            StatisticRows.Append(buffer.CellId, statistics, rows);
            if (SpectralDirectionality is { } spectral)
                for (int k = 0; k < rows.Count; k++)
                    if (rows[k].Parameter == WaveParameter.D && spectral.TryGetValue((buffer.CellId, rows[k].Period), out double d))
                        rows[k] = rows[k] with { Mean = double.IsFinite(d) ? (float)d : null };
            var cellId = buffer.CellId;
            free.TryWrite(buffer);
            await results.WriteAsync(new CellResult(cellId, rows), cancel);
        }
    }
}
