using System.Diagnostics;
using System.Text.Json.Nodes;
using System.Threading.Channels;
using Atlas.Ingest.Ingestion;
using Atlas.Ingest.Progress;
using Atlas.Statistics;
using Atlas.Storage.Cells;
using Atlas.Storage.Datasets;
using Atlas.Storage.Series;
using Atlas.Storage.Statistics;
using Npgsql;

namespace Atlas.Ingest.Statistics;

/// <summary>
/// Computes and stores the statistics of a dataset's cells whose series changed since they were last computed
/// (or of all cells; a changed cell's whole block of 1,024 cell ids is recomputed, since blocks are stored whole). One
/// streaming pass: chunks come out of PostgreSQL by binary COPY ordered by cell, each cell's series is assembled
/// once, a calculator per core computes every period, and the results, packed per block, go back by binary COPY in
/// batches. Memory is bounded by the cell buffers and the few open blocks in flight, whatever the dataset size.
/// </summary>
public sealed class StatisticsService(NpgsqlDataSource dataSource, StatisticsOptions? options = null)
{
    private readonly StatisticsOptions _options = options ?? new StatisticsOptions();
    private const int CellsPerBatch = 2000;
    private const int WriterConnections = 2;

    public async Task<StatisticsSummary> RunAsync(string slug, bool all, IProgress<ProgressSnapshot>? progress = null, CancellationToken cancel = default)
    {
        var clock = Stopwatch.StartNew();
        var datasets = new DatasetStore(dataSource);
        var dataset = await datasets.FindAsync(slug, cancel) ?? throw new IngestException($"There is no dataset '{slug}'.");
        var statistics = new StatisticsStore(dataSource);
        var cells = (await new CellStore(dataSource).AllAsync(dataset.Id, cancel)).Where(c => c.Wet).ToDictionary(c => c.CellId);
        // Statistics of an earlier method are all recomputed, whatever changed: old and new values never mix.
        var methodChanged = !all && StoredMethodVersion(dataset.MetadataJson) is { } stored && stored != Atlas.Statistics.MethodNotes.Version;
        all |= methodChanged;
        var targets = all ? cells.Keys.Order().ToArray() : WholeBlocks(await statistics.StaleCellsAsync(dataset.Id, cancel), cells.Keys);
        if (targets.Length == 0) return new StatisticsSummary(slug, 0, 0, 0, 0, clock.Elapsed);

        var timelines = await datasets.TimelinesAsync(dataset.Id, cancel);
        var times = timelines.Values.SelectMany(t => t).ToArray();
        var offsets = new Dictionary<int, (int, int)>();
        var offset = 0;
        foreach (var (year, line) in timelines) { offsets[year] = (offset, line.Length); offset += line.Length; }

        var workers = Math.Max(1, Environment.ProcessorCount);
        var free = Channel.CreateUnbounded<CellSeriesBuffer>();
        for (var i = 0; i < 2 * workers + 2; i++) free.Writer.TryWrite(new CellSeriesBuffer(times.Length));
        var work = Channel.CreateBounded<CellSeriesBuffer>(workers * 2);
        var results = Channel.CreateBounded<(int Cell, List<StatisticRow> Rows)>(workers * 4);
        using var linked = CancellationTokenSource.CreateLinkedTokenSource(cancel);
        var token = linked.Token;

        var producer = Task.Run(async () =>
        {
            try
            {
                var onlyCells = targets.Length == cells.Count ? null : targets;
                // Chunks arrive ordered by cell: each is decoded into the cell's buffer as it streams past (its payload
                // is only a view of the reader's buffer), and the buffer goes to the calculators when the cell ends.
                CellSeriesBuffer? buffer = null;
                var current = -1;
                await foreach (var chunk in new SeriesStore(dataSource).StreamAsync(dataset.Id, onlyCells, token))
                {
                    if (chunk.CellId != current)
                    {
                        if (buffer is not null) await work.Writer.WriteAsync(buffer, token);
                        buffer = null;
                        current = chunk.CellId;
                        if (cells.TryGetValue(current, out var cell))
                        {
                            buffer = await free.Reader.ReadAsync(token);
                            buffer.Begin(current, cell.DepthMetres ?? double.NaN);
                        }
                    }
                    buffer?.Add(chunk.Year, chunk.Payload.Span, offsets);
                }
                if (buffer is not null) await work.Writer.WriteAsync(buffer, token);
                work.Writer.Complete();
            }
            catch (Exception e)
            {
                work.Writer.Complete(e);
                throw;
            }
        }, token);

        var calculators = Enumerable.Range(0, workers).Select(_ => Task.Run(async () =>
        {
            var calculator = new BinnedCellCalculator(_options);
            await foreach (var buffer in work.Reader.ReadAllAsync(token))
            {
                var rows = new List<StatisticRow>(160);
                StatisticRows.Append(buffer.CellId, calculator.Compute(buffer.AsSeries(times)), rows);
                var cellId = buffer.CellId;
                free.Writer.TryWrite(buffer);
                await results.Writer.WriteAsync((cellId, rows), token);
            }
        }, token)).ToArray();
        var closer = Task.WhenAll(calculators).ContinueWith(t => results.Writer.Complete(t.Exception), TaskScheduler.Default);

        var computedAt = DateTime.UtcNow;
        // Batches are written by tasks of their own, so the calculators keep computing while PostgreSQL stores them, on
        // two connections so that one batch's COPY overlaps the other's commit. Batches hold disjoint blocks, so their
        // transactions never wait on each other.
        var batches = Channel.CreateBounded<(List<int> Cells, List<StatisticBlock> Blocks)>(2);
        long rowCount = 0;
        var done = 0;
        var writers = Enumerable.Range(0, WriterConnections).Select(_ => Task.Run(async () =>
        {
            try
            {
                await foreach (var (batchCells, batchBlocks) in batches.Reader.ReadAllAsync(token))
                {
                    await statistics.ReplaceBlocksAsync(dataset.Id, batchCells, batchBlocks, computedAt, token);
                    var cellsDone = Interlocked.Add(ref done, batchCells.Count);
                    progress?.Report(new ProgressSnapshot("statistics", cellsDone, targets.Length, 0, clock.Elapsed, "cells"));
                }
            }
            catch
            {
                await linked.CancelAsync();
                throw;
            }
        }, token)).ToArray();
        var writer = Task.WhenAll(writers);
        var periodCodes = new HashSet<short>();
        try
        {
            // Statistics are stored in blocks of cells, so a batch holds whole blocks: a block goes out once every target
            // cell in it has come back (cells arrive nearly in order, so few blocks are open at a time). Blocks with a
            // cell that had no series at all go out at the end. Rows go into their block's columns as they come, so
            // none outlives its cell.
            var missing = targets.GroupBy(StatisticBlock.BlockOf).ToDictionary(g => g.Key, g => g.Count());
            var open = new Dictionary<int, (List<int> Cells, StatisticBlockBuilder Builder)>();
            var cellsInBatch = new List<int>(CellsPerBatch);
            var blocksInBatch = new List<StatisticBlock>();
            async Task CloseAsync(int block)
            {
                var (blockCells, builder) = open[block];
                open.Remove(block);
                cellsInBatch.AddRange(blockCells);
                blocksInBatch.AddRange(builder.Build());
                if (cellsInBatch.Count < CellsPerBatch) return;
                await batches.Writer.WriteAsync((cellsInBatch, blocksInBatch), token);
                cellsInBatch = new List<int>(CellsPerBatch);
                blocksInBatch = [];
            }
            await foreach (var (cell, rows) in results.Reader.ReadAllAsync(token))
            {
                var block = StatisticBlock.BlockOf(cell);
                if (!open.TryGetValue(block, out var pending))
                    open[block] = pending = (new List<int>(StatisticBlock.CellsPerBlock), new StatisticBlockBuilder(block));
                pending.Cells.Add(cell);
                foreach (var row in rows)
                {
                    pending.Builder.Add(row);
                    periodCodes.Add(row.Period.Code);
                }
                rowCount += rows.Count;
                if (--missing[block] == 0) await CloseAsync(block);
            }
            foreach (var block in open.Keys.Order().ToArray()) await CloseAsync(block);
            if (cellsInBatch.Count > 0) await batches.Writer.WriteAsync((cellsInBatch, blocksInBatch), token);
            batches.Writer.Complete();
            await producer;
            await Task.WhenAll(calculators);
            await closer;
            await writer;
        }
        catch (Exception e)
        {
            await linked.CancelAsync();
            // Report the stage that failed first, not the cancellation it caused elsewhere.
            var first = writers.Append(producer).Concat(calculators).FirstOrDefault(t => t.IsFaulted)?.Exception?.InnerException;
            if (first is not null && e is OperationCanceledException && !cancel.IsCancellationRequested)
                System.Runtime.ExceptionServices.ExceptionDispatchInfo.Throw(first);
            throw;
        }

        await datasets.MergeMetadataAsync(dataset.Id, MethodNotes(computedAt), cancel);
        return new StatisticsSummary(slug, done, periodCodes.Count, rowCount, (long)done * times.Length, clock.Elapsed, methodChanged);
    }

    /// <summary>The method version of a dataset's stored statistics: null before any pass, 1 for passes that recorded none.</summary>
    public static int? StoredMethodVersion(string metadataJson)
    {
        var root = JsonNode.Parse(metadataJson) as JsonObject;
        if (root?["statistics"] is not JsonObject notes) return null;
        return notes["method_version"] is JsonValue v && v.TryGetValue(out int version) ? version : 1;
    }

    /// <summary>The wet cells of every block that holds a stale cell: blocks are stored whole, so they are computed whole.</summary>
    private static int[] WholeBlocks(int[] stale, IEnumerable<int> wetCells)
    {
        var blocks = stale.Select(StatisticBlock.BlockOf).ToHashSet();
        return wetCells.Where(c => blocks.Contains(StatisticBlock.BlockOf(c))).Order().ToArray();
    }

    private string MethodNotes(DateTime computedAt)
    {
        var notes = new JsonObject
        {
            ["statistics"] = new JsonObject
            {
                ["computed_at"] = computedAt.ToString("O"),
                ["method_version"] = Atlas.Statistics.MethodNotes.Version,
                ["software_version"] = typeof(StatisticsService).Assembly.GetName().Version?.ToString(),
                ["power"] = "omnidirectional power per time step from Hm0 and Te with the linear-theory group velocity at Te and the cell depth " +
                            "(rho 1025 kg/m3, g 9.81 m/s2; deep water where the depth is unknown), then averaged; never from mean Hs and mean Te",
                ["energy_period"] = $"Te from the source; where absent, assumed from Tp for the {Atlas.Statistics.MethodNotes.AssumedSpectrum(_options.AssumedSpectrum)}",
                ["direction"] = "power-weighted circular mean of the direction waves come from; 16-sector power rose",
                ["directionality"] = Atlas.Statistics.MethodNotes.Directionality,
                ["percentiles_layers"] = $"from fixed-bin histograms: Hs {_options.HsBinning.BinWidth} m, Te/Tp {_options.PeriodBinning.BinWidth} s, " +
                                         $"J {_options.PowerBinning.BinWidth} kW/m, spread {_options.SpreadBinning.BinWidth} degree",
                ["percentiles_points"] = "exact, from the stored series (linear interpolation between order statistics, NumPy's default)",
                ["coverage"] = Atlas.Statistics.MethodNotes.Coverage(_options.LowCoverageThreshold),
                ["climatology"] = Atlas.Statistics.MethodNotes.Climatology,
                ["weighted_percentiles"] = Atlas.Statistics.MethodNotes.WeightedPercentiles,
                ["inter_annual"] = Atlas.Statistics.MethodNotes.InterAnnual,
                ["hs_thresholds_m"] = new JsonArray(_options.HsThresholdsMetres.Select(v => (JsonNode)JsonValue.Create(v)).ToArray()),
                ["j_thresholds_kw_per_m"] = new JsonArray(_options.PowerThresholdsKilowattsPerMetre.Select(v => (JsonNode)JsonValue.Create(v)).ToArray()),
                ["seasons"] = Atlas.Statistics.MethodNotes.Seasons,
            },
        };
        return notes.ToJsonString();
    }
}
