using System.Runtime.CompilerServices;

namespace Atlas.Storage.Statistics;

/// <summary>
/// Gathers the statistic rows of one block of cells as they are computed, straight into per-column arrays, so that no
/// row object outlives its cell; <see cref="Build"/> then gives the block's stored form, one
/// <see cref="StatisticBlock"/> per parameter and period, cells ascending. <see cref="Restart"/> makes it ready for another
/// block with the arrays it has, so that a pass does not leave a block's worth of them behind for every block.
/// </summary>
public sealed class StatisticBlockBuilder(int block)
{
    private readonly Dictionary<(WaveParameter Parameter, AtlasPeriod Period), Group> _groups = [];

    public int Block { get; private set; } = block;

    /// <summary>Forgets every row and starts gathering the rows of <paramref name="block"/>.</summary>
    public void Restart(int block)
    {
        Block = block;
        foreach (var group in _groups.Values) group.Clear();
    }

    /// <summary>Adds one row; its cell must belong to this block, and appear once per parameter and period.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public void Add(StatisticRow row)
    {
        int place = row.CellId - Block * StatisticBlock.CellsPerBlock;
        if (row.CellId < 0 || (uint)place >= StatisticBlock.CellsPerBlock)
            throw new ArgumentException($"Cell {row.CellId} is not in block {Block}.", nameof(row));
        var key = (row.Parameter, row.Period);
        if (!_groups.TryGetValue(key, out var group)) _groups[key] = group = new Group();
        group.Add(row, place);
    }

    /// <summary>The block's rows packed, by parameter then period. Not-finite optional values become NaN.</summary>
    public IReadOnlyList<StatisticBlock> Build()
    {
        var blocks = new List<StatisticBlock>(_groups.Count);
        foreach (var ((parameter, period), group) in _groups.OrderBy(g => g.Key))
            if (group.Rows > 0) blocks.Add(group.Build(parameter, period, Block));
        return blocks;
    }

    /// <summary>
    /// The rows of one parameter and period, each at its cell's place in the block (cell id less the block's first id),
    /// so that they come out by cell id without sorting, whatever order the cells finished in.
    /// </summary>
    private sealed class Group
    {
        private readonly bool[] _present = new bool[StatisticBlock.CellsPerBlock];
        private readonly int[] _counts = new int[StatisticBlock.CellsPerBlock];
        private readonly float[][] _columns = [.. Enumerable.Range(0, 9).Select(_ => new float[StatisticBlock.CellsPerBlock])];
        // Each row's fractions copied in (place-major, _stride per place), so that the row's own array dies with the row.
        private readonly int[] _extraLength = new int[StatisticBlock.CellsPerBlock];
        private float[] _extra = [];
        private int _rows, _width, _stride;
        private int? _duplicate;

        public int Rows => _rows;

        public void Clear()
        {
            Array.Clear(_present);
            Array.Clear(_extraLength);
            _rows = _width = 0;
            _duplicate = null;
        }

        [MethodImpl(MethodImplOptions.AggressiveOptimization)]
        public void Add(StatisticRow row, int place)
        {
            if (_present[place])
            {
                _duplicate ??= row.CellId;
                return;
            }
            _present[place] = true;
            _rows++;
            _counts[place] = row.Count;
            _columns[0][place] = row.Coverage;
            _columns[1][place] = Stored(row.Mean);
            _columns[2][place] = Stored(row.Sd);
            _columns[3][place] = Stored(row.Min);
            _columns[4][place] = Stored(row.Max);
            _columns[5][place] = Stored(row.P10);
            _columns[6][place] = Stored(row.P50);
            _columns[7][place] = Stored(row.P90);
            _columns[8][place] = Stored(row.P99);
            var fractions = row.Fractions ?? [];
            if (fractions.Length > _stride) Widen(fractions.Length);
            fractions.CopyTo(_extra, place * _stride);
            _extraLength[place] = fractions.Length;
            _width = Math.Max(_width, fractions.Length);
        }

        [MethodImpl(MethodImplOptions.AggressiveOptimization)]
        public StatisticBlock Build(WaveParameter parameter, AtlasPeriod period, int block)
        {
            if (_duplicate is { } twice)
                throw new ArgumentException($"Cell {twice} has two rows for parameter {parameter.Symbol()} and period {period}.");
            var n = _rows;
            var ids = new int[n];
            var counts = new int[n];
            var columns = new float[9][];
            for (var c = 0; c < columns.Length; c++) columns[c] = new float[n];
            var extra = _width > 0 ? new float[n * _width] : null;
            extra?.AsSpan().Fill(float.NaN);
            var i = 0;
            for (var place = 0; place < StatisticBlock.CellsPerBlock; place++)
            {
                if (!_present[place]) continue;
                ids[i] = block * StatisticBlock.CellsPerBlock + place;
                counts[i] = _counts[place];
                for (var c = 0; c < columns.Length; c++) columns[c][i] = _columns[c][place];
                if (extra is not null) _extra.AsSpan(place * _stride, _extraLength[place]).CopyTo(extra.AsSpan(i * _width));
                i++;
            }
            return new StatisticBlock(parameter, period, block, ids, counts, columns[0], columns[1], columns[2], columns[3], columns[4],
                columns[5], columns[6], columns[7], columns[8], _width, extra);
        }

        /// <summary>Room for rows of <paramref name="width"/> fractions, keeping those already placed.</summary>
        private void Widen(int width)
        {
            var wider = new float[StatisticBlock.CellsPerBlock * width];
            for (var place = 0; place < StatisticBlock.CellsPerBlock; place++)
                if (_present[place]) _extra.AsSpan(place * _stride, _extraLength[place]).CopyTo(wider.AsSpan(place * width));
            (_extra, _stride) = (wider, width);
        }

        private static float Stored(float? value) => value is { } v && float.IsFinite(v) ? v : float.NaN;
    }
}
