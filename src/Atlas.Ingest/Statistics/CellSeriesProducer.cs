using System.Threading.Channels;
using Atlas.Storage.Cells;
using Atlas.Storage.Series;

namespace Atlas.Ingest.Statistics;

/// <summary>
/// The produce stage of a statistics pass: streams the target cells' chunks out of Storage (binary COPY, ordered by
/// cell), decodes each cell's chunks into a free <see cref="CellSeriesBuffer"/> as they stream past, and hands the
/// buffer on when the cell ends. Cells that are not wet are passed over. Buffers come from the free pool and go back
/// to it from the calculators, so the number of series in memory stays fixed.
/// </summary>
public sealed class CellSeriesProducer(SeriesStore series, int datasetId, IReadOnlyDictionary<int, CellRecord> wetCells, int[]? onlyCells,
    DatasetTimeline timeline)
{
    /// <summary>For a dataset of output points: each station-year's power integrated from the spectra, by (cell, year).</summary>
    public IReadOnlyDictionary<(int Cell, int Year), float[]>? SpectralPower { get; init; }

    /// <summary>Produces every cell's series into <paramref name="work"/> and completes it (with the error, on failure).</summary>
    public async Task RunAsync(ChannelReader<CellSeriesBuffer> free, ChannelWriter<CellSeriesBuffer> work, CancellationToken cancel)
    {
        try
        {
            // A chunk's payload is only a view of the reader's buffer: it is decoded at once, never kept.
            CellSeriesBuffer? buffer = null;
            var current = -1;
            await foreach (var chunk in series.StreamAsync(datasetId, onlyCells, cancel))
            {
                if (chunk.CellId != current)
                {
                    if (buffer is not null) await work.WriteAsync(buffer, cancel);
                    buffer = null;
                    current = chunk.CellId;
                    if (wetCells.TryGetValue(current, out var cell))
                    {
                        buffer = await free.ReadAsync(cancel);
                        buffer.Begin(current, cell.DepthMetres ?? double.NaN);
                    }
                }
                buffer?.Add(chunk.Year, chunk.Payload.Span, timeline.Years);
                if (buffer is not null && SpectralPower?.GetValueOrDefault((chunk.CellId, chunk.Year)) is { } power)
                    buffer.AddPower(chunk.Year, power, timeline.Years);
            }
            if (buffer is not null) await work.WriteAsync(buffer, cancel);
            work.Complete();
        }
        catch (Exception e)
        {
            work.Complete(e);
            throw;
        }
    }
}
