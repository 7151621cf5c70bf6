namespace Atlas.Storage.Statistics;

/// <summary>
/// The stored form of statistics: one parameter over one period for the cells of one block of
/// <see cref="CellsPerBlock"/> consecutive cell ids, each statistic an array over the block's cells (ascending ids).
/// Absent values are NaN. <see cref="Extra"/> holds <see cref="ExtraWidth"/> values per cell, cell after cell.
/// </summary>
public sealed record StatisticBlock(
    short Parameter,
    short Period,
    int Block,
    int[] CellIds,
    int[] Count,
    float[] Coverage,
    float[] Mean,
    float[] Sd,
    float[] Min,
    float[] Max,
    float[] P10,
    float[] P50,
    float[] P90,
    float[] P99,
    int ExtraWidth,
    float[]? Extra)
{
    /// <summary>
    /// Cells per block: large enough that a layer of a million cells is about a thousand rows, small enough that
    /// replacing a few cells rewrites little.
    /// </summary>
    public const int CellsPerBlock = 1024;

    public static int BlockOf(int cellId) => cellId / CellsPerBlock;

    /// <summary>
    /// Packs rows into blocks, one per parameter, period and block. A cell may appear once per parameter and period.
    /// Not-finite optional values become NaN; a cell without extra values gets NaN in a block whose others have them.
    /// </summary>
    public static IReadOnlyList<StatisticBlock> Pack(IEnumerable<StatisticRow> rows)
    {
        var groups = new Dictionary<(short Parameter, short Period, int Block), List<StatisticRow>>();
        foreach (var row in rows)
        {
            var key = (row.Parameter, row.Period, BlockOf(row.CellId));
            if (!groups.TryGetValue(key, out var list)) groups[key] = list = [];
            list.Add(row);
        }
        var blocks = new List<StatisticBlock>(groups.Count);
        foreach (var ((parameter, period, block), list) in groups.OrderBy(g => g.Key))
        {
            list.Sort((a, b) => a.CellId.CompareTo(b.CellId));
            var n = list.Count;
            var width = 0;
            foreach (var row in list) width = Math.Max(width, row.Extra?.Length ?? 0);
            var packed = new StatisticBlock(parameter, period, block, new int[n], new int[n], new float[n], new float[n], new float[n],
                new float[n], new float[n], new float[n], new float[n], new float[n], new float[n], width, width > 0 ? new float[n * width] : null);
            for (var i = 0; i < n; i++)
            {
                var row = list[i];
                if (i > 0 && row.CellId == list[i - 1].CellId)
                    throw new ArgumentException($"Cell {row.CellId} has two rows for parameter {parameter} and period {period}.", nameof(rows));
                packed.CellIds[i] = row.CellId;
                packed.Count[i] = row.Count;
                packed.Coverage[i] = row.Coverage;
                packed.Mean[i] = Stored(row.Mean);
                packed.Sd[i] = Stored(row.Sd);
                packed.Min[i] = Stored(row.Min);
                packed.Max[i] = Stored(row.Max);
                packed.P10[i] = Stored(row.P10);
                packed.P50[i] = Stored(row.P50);
                packed.P90[i] = Stored(row.P90);
                packed.P99[i] = Stored(row.P99);
                if (packed.Extra is { } extra)
                {
                    var slice = extra.AsSpan(i * width, width);
                    slice.Fill(float.NaN);
                    row.Extra?.CopyTo(slice);
                }
            }
            blocks.Add(packed);
        }
        return blocks;
    }

    /// <summary>The block's rows, by ascending cell id; NaN values come back as null.</summary>
    public IEnumerable<StatisticRow> Unpack()
    {
        for (var i = 0; i < CellIds.Length; i++)
            yield return new StatisticRow(CellIds[i], Period, Parameter, Read(Mean[i]), Read(Sd[i]), Read(Min[i]), Read(Max[i]),
                Read(P10[i]), Read(P50[i]), Read(P90[i]), Read(P99[i]), Count[i], Coverage[i],
                Extra is null ? null : Extra.AsSpan(i * ExtraWidth, ExtraWidth).ToArray());
    }

    /// <summary>The array behind a stored statistic column.</summary>
    public float[] Column(StoredStatistic statistic) => statistic switch
    {
        StoredStatistic.Mean => Mean,
        StoredStatistic.Sd => Sd,
        StoredStatistic.Min => Min,
        StoredStatistic.Max => Max,
        StoredStatistic.P10 => P10,
        StoredStatistic.P50 => P50,
        StoredStatistic.P90 => P90,
        StoredStatistic.P99 => P99,
        StoredStatistic.Coverage => Coverage,
        _ => throw new ArgumentOutOfRangeException(nameof(statistic), statistic, "Not a real-valued statistic column."),
    };

    private static float Stored(float? value) => value is { } v && float.IsFinite(v) ? v : float.NaN;

    private static float? Read(float value) => float.IsNaN(value) ? null : value;
}
