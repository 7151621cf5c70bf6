namespace Atlas.Storage.Statistics;

/// <summary>
/// The stored form of statistics: one parameter over one period for the cells of one block of
/// <see cref="CellsPerBlock"/> consecutive cell ids, each statistic an array over the block's cells (ascending ids).
/// Absent values are NaN. <see cref="Fractions"/> holds <see cref="FractionsWidth"/> values per cell, cell after cell
/// (stored in the column <c>extra</c>).
/// </summary>
public sealed record StatisticBlock(
    WaveParameter Parameter,
    AtlasPeriod Period,
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
    int FractionsWidth,
    float[]? Fractions)
{
    /// <summary>
    /// Cells per block: large enough that a layer of a million cells is about a thousand rows, small enough that
    /// replacing a few cells rewrites little.
    /// </summary>
    public const int CellsPerBlock = 1024;

    public static int BlockOf(int cellId) => cellId / CellsPerBlock;

    /// <summary>
    /// Packs rows into blocks, one per parameter, period and block (see <see cref="StatisticBlockBuilder"/>). A cell may
    /// appear once per parameter and period. Not-finite optional values become NaN; a cell without fractions gets
    /// NaN in a block whose others have them.
    /// </summary>
    public static IReadOnlyList<StatisticBlock> Pack(IEnumerable<StatisticRow> rows)
    {
        var builders = new SortedDictionary<int, StatisticBlockBuilder>();
        foreach (var row in rows)
        {
            var block = BlockOf(row.CellId);
            if (!builders.TryGetValue(block, out var builder)) builders[block] = builder = new StatisticBlockBuilder(block);
            builder.Add(row);
        }
        return builders.Values.SelectMany(b => b.Build()).ToList();
    }

    /// <summary>The block's rows, by ascending cell id; NaN values come back as null.</summary>
    public IEnumerable<StatisticRow> Unpack()
    {
        for (var i = 0; i < CellIds.Length; i++)
            yield return new StatisticRow(CellIds[i], Period, Parameter, Read(Mean[i]), Read(Sd[i]), Read(Min[i]), Read(Max[i]),
                Read(P10[i]), Read(P50[i]), Read(P90[i]), Read(P99[i]), Count[i], Coverage[i],
                Fractions is null ? null : Fractions.AsSpan(i * FractionsWidth, FractionsWidth).ToArray());
    }

    private static float? Read(float value) => float.IsNaN(value) ? null : value;
}
