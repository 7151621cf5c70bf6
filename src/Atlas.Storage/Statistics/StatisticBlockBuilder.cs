namespace Atlas.Storage.Statistics;

/// <summary>
/// Gathers the statistic rows of one block of cells as they are computed, straight into per-column lists, so that no
/// row object outlives its cell; <see cref="Build"/> then gives the block's stored form, one
/// <see cref="StatisticBlock"/> per parameter and period, cells ascending.
/// </summary>
public sealed class StatisticBlockBuilder(int block)
{
    private readonly Dictionary<(WaveParameter Parameter, AtlasPeriod Period), Group> _groups = [];

    public int Block { get; } = block;

    /// <summary>Adds one row; its cell must belong to this block, and appear once per parameter and period.</summary>
    public void Add(StatisticRow row)
    {
        if (StatisticBlock.BlockOf(row.CellId) != Block)
            throw new ArgumentException($"Cell {row.CellId} is not in block {Block}.", nameof(row));
        var key = (row.Parameter, row.Period);
        if (!_groups.TryGetValue(key, out var group)) _groups[key] = group = new Group();
        group.Add(row);
    }

    /// <summary>The block's rows packed, by parameter then period. Not-finite optional values become NaN.</summary>
    public IReadOnlyList<StatisticBlock> Build()
    {
        var blocks = new List<StatisticBlock>(_groups.Count);
        foreach (var ((parameter, period), group) in _groups.OrderBy(g => g.Key))
            blocks.Add(group.Build(parameter, period, Block));
        return blocks;
    }

    private sealed class Group
    {
        private readonly List<int> _cells = [], _counts = [], _extraStart = [];
        private readonly List<float>[] _columns = [.. Enumerable.Range(0, 9).Select(_ => new List<float>())];
        private readonly List<float> _extra = [];
        private int _width;

        public void Add(StatisticRow row)
        {
            _cells.Add(row.CellId);
            _counts.Add(row.Count);
            _columns[0].Add(row.Coverage);
            _columns[1].Add(Stored(row.Mean));
            _columns[2].Add(Stored(row.Sd));
            _columns[3].Add(Stored(row.Min));
            _columns[4].Add(Stored(row.Max));
            _columns[5].Add(Stored(row.P10));
            _columns[6].Add(Stored(row.P50));
            _columns[7].Add(Stored(row.P90));
            _columns[8].Add(Stored(row.P99));
            _extraStart.Add(_extra.Count);
            if (row.Fractions is { } extra)
            {
                _extra.AddRange(extra);
                _width = Math.Max(_width, extra.Length);
            }
        }

        public StatisticBlock Build(WaveParameter parameter, AtlasPeriod period, int block)
        {
            var n = _cells.Count;
            // Rows arrive as the cells finish, nearly but not quite in order.
            var order = Enumerable.Range(0, n).ToArray();
            Array.Sort(_cells.ToArray(), order);
            var ids = new int[n];
            var counts = new int[n];
            var columns = new float[9][];
            for (var c = 0; c < columns.Length; c++) columns[c] = new float[n];
            var extra = _width > 0 ? new float[n * _width] : null;
            extra?.AsSpan().Fill(float.NaN);
            for (var i = 0; i < n; i++)
            {
                var k = order[i];
                if (i > 0 && _cells[k] == ids[i - 1])
                    throw new ArgumentException($"Cell {_cells[k]} has two rows for parameter {parameter.Symbol()} and period {period}.");
                ids[i] = _cells[k];
                counts[i] = _counts[k];
                for (var c = 0; c < columns.Length; c++) columns[c][i] = _columns[c][k];
                if (extra is not null)
                {
                    var end = k + 1 < n ? _extraStart[k + 1] : _extra.Count;
                    for (var e = _extraStart[k]; e < end; e++) extra[i * _width + e - _extraStart[k]] = _extra[e];
                }
            }
            return new StatisticBlock(parameter, period, block, ids, counts, columns[0], columns[1], columns[2], columns[3], columns[4],
                columns[5], columns[6], columns[7], columns[8], _width, extra);
        }

        private static float Stored(float? value) => value is { } v && float.IsFinite(v) ? v : float.NaN;
    }
}
