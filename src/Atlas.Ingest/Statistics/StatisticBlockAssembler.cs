using System.Threading.Channels;
using Atlas.Storage.Statistics;

namespace Atlas.Ingest.Statistics;

/// <summary>Whole blocks of statistics ready to store, and the cells they hold.</summary>
public sealed record StatisticBatch(List<int> Cells, List<StatisticBlock> Blocks);

/// <summary>
/// The assemble stage of a statistics pass. Statistics are stored in blocks of cells, so a batch holds whole blocks: a
/// block goes out once every target cell in it has come back (cells arrive nearly in order, so few blocks are open at
/// a time). Blocks with a cell that had no series at all go out at the end. Rows go into their block's columns as they
/// come, so none outlives its cell.
/// </summary>
public sealed class StatisticBlockAssembler(IReadOnlyList<int> targets, int cellsPerBatch)
{
    private readonly HashSet<AtlasPeriod> _periods = [];

    /// <summary>Where the lists of rows go back once their rows are placed.</summary>
    public RowListPool? RowLists { get; init; }

    /// <summary>Rows assembled so far.</summary>
    public long Rows { get; private set; }

    /// <summary>Distinct periods among the rows.</summary>
    public int Periods => _periods.Count;

    /// <summary>Assembles every result into batches; completes <paramref name="batches"/> when the results end.</summary>
    public async Task RunAsync(ChannelReader<CellResult> results, ChannelWriter<StatisticBatch> batches, CancellationToken cancel)
    {
        var missing = targets.GroupBy(StatisticBlock.BlockOf).ToDictionary(g => g.Key, g => g.Count());
        var open = new Dictionary<int, (List<int> Cells, StatisticBlockBuilder Builder)>();
        // Builders of closed blocks, reused for the next ones (cells arrive nearly in order, so few are ever open).
        var spare = new Stack<StatisticBlockBuilder>();
        var batch = NewBatch();
        async Task CloseAsync(int block)
        {
            var (blockCells, builder) = open[block];
            open.Remove(block);
            batch.Cells.AddRange(blockCells);
            batch.Blocks.AddRange(builder.Build());
            spare.Push(builder);
            if (batch.Cells.Count < cellsPerBatch) return;
            await batches.WriteAsync(batch, cancel);
            batch = NewBatch();
        }
        await foreach (var (cell, rows) in results.ReadAllAsync(cancel))
        {
            var block = StatisticBlock.BlockOf(cell);
            if (!open.TryGetValue(block, out var pending))
            {
                var builder = spare.TryPop(out var reused) ? reused : new StatisticBlockBuilder(block);
                builder.Restart(block);
                open[block] = pending = (new List<int>(StatisticBlock.CellsPerBlock), builder);
            }
            pending.Cells.Add(cell);
            foreach (var row in rows)
            {
                pending.Builder.Add(row);
                _periods.Add(row.Period);
            }
            Rows += rows.Count;
            RowLists?.Return(rows);
            if (--missing[block] == 0) await CloseAsync(block);
        }
        foreach (var block in open.Keys.Order().ToArray()) await CloseAsync(block);
        if (batch.Cells.Count > 0) await batches.WriteAsync(batch, cancel);
        batches.Complete();
    }

    private StatisticBatch NewBatch() => new(new List<int>(cellsPerBatch), []);
}
