using System.Collections.Concurrent;
using Atlas.Storage.Statistics;

namespace Atlas.Ingest.Statistics;

/// <summary>
/// Lists of a cell's rows, handed from the calculators to the assembler and back once assembled, so that a pass uses a
/// few lists (as many as are in flight) rather than one per cell.
/// </summary>
public sealed class RowListPool
{
    private readonly ConcurrentQueue<List<StatisticRow>> _free = new();

    /// <summary>An empty list.</summary>
    public List<StatisticRow> Rent() => _free.TryDequeue(out var list) ? list : new List<StatisticRow>(160);

    /// <summary>Takes a list back once its rows are used.</summary>
    public void Return(List<StatisticRow> list)
    {
        list.Clear();
        _free.Enqueue(list);
    }
}
