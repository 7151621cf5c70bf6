namespace Atlas.Demo;

/// <summary>
/// One calendar month of hindcast fields on the full grid, time-major
/// (<c>[time, row, column]</c>, rows south to north), single precision, land cells holding
/// <see cref="FillValue"/>. The buffers hold the longest month, so one instance can be refilled
/// month after month (<see cref="Fill"/>) without new large allocations; the field spans cover
/// only the current month's steps.
/// </summary>
public sealed class MonthlyFields
{
    /// <summary>The value land cells hold in every field.</summary>
    public const float FillValue = -999f;

    private readonly int _cells;
    private readonly float[] _hs, _te, _tp, _direction, _spread;

    /// <summary>Buffers for months of up to 31 days every <paramref name="stepHours"/> hours on a grid of <paramref name="cells"/> cells.</summary>
    public MonthlyFields(int cells, int stepHours)
    {
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(cells);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(stepHours);
        _cells = cells;
        int capacity = 31 * 24 / stepHours * cells;
        _hs = new float[capacity];
        _te = new float[capacity];
        _tp = new float[capacity];
        _direction = new float[capacity];
        _spread = new float[capacity];
        Times = [];
    }

    /// <summary>First day of the month (UTC).</summary>
    public DateTime Month { get; private set; }

    /// <summary>Instant of each step (UTC).</summary>
    public DateTime[] Times { get; private set; }

    /// <summary>Significant wave height Hm0, m.</summary>
    public Span<float> Hs => _hs.AsSpan(0, Times.Length * _cells);

    /// <summary>Energy period Tm-1,0, s.</summary>
    public Span<float> Te => _te.AsSpan(0, Times.Length * _cells);

    /// <summary>Peak period, s.</summary>
    public Span<float> Tp => _tp.AsSpan(0, Times.Length * _cells);

    /// <summary>Mean direction the waves come from, degrees true, in [0, 360).</summary>
    public Span<float> Direction => _direction.AsSpan(0, Times.Length * _cells);

    /// <summary>Directional spread, degrees.</summary>
    public Span<float> Spread => _spread.AsSpan(0, Times.Length * _cells);

    /// <summary>The fields of the month starting at <paramref name="month"/>, in new buffers.</summary>
    public static MonthlyFields Generate(SeaStateModel model, DateTime month, int stepHours)
    {
        ArgumentNullException.ThrowIfNull(model);
        var fields = new MonthlyFields(model.Grid.Columns * model.Grid.Rows, stepHours);
        fields.Fill(model, month, stepHours);
        return fields;
    }

    /// <summary>
    /// Evaluates <paramref name="model"/> at every step of the month starting at
    /// <paramref name="month"/>, every <paramref name="stepHours"/> hours from midnight on the 1st,
    /// replacing what the buffers held. Cells are independent, so the parallel loop gives the same
    /// values on every run.
    /// </summary>
    public void Fill(SeaStateModel model, DateTime month, int stepHours)
    {
        ArgumentNullException.ThrowIfNull(model);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(stepHours);
        var grid = model.Grid;
        int cells = grid.Columns * grid.Rows;
        if (cells != _cells)
            throw new ArgumentException($"the buffers are for {_cells} cells, the model's grid has {cells}", nameof(model));
        int steps = (int)(month.AddMonths(1) - month).TotalHours / stepHours;
        if (steps * cells > _hs.Length)
            throw new ArgumentOutOfRangeException(nameof(stepHours), stepHours, "the buffers were sized for a longer step");
        var times = new DateTime[steps];
        for (int s = 0; s < steps; s++) times[s] = month.AddHours(s * stepHours);
        Month = month;
        Times = times;

        for (int c = 0; c < cells; c++)
        {
            if (!grid.IsLand[c]) continue;
            for (int s = 0; s < steps; s++)
            {
                int at = s * cells + c;
                _hs[at] = _te[at] = _tp[at] = _direction[at] = _spread[at] = FillValue;
            }
        }
        double firstHour = (month - model.Forcing.Origin).TotalHours;
        Parallel.For(0, grid.WetCount, k =>
        {
            int c = grid.WetCells[k];
            for (int s = 0; s < steps; s++)
            {
                var state = model.Evaluate(k, firstHour + s * stepHours);
                int at = s * cells + c;
                _hs[at] = (float)state.Hs;
                _te[at] = (float)state.Te;
                _tp[at] = (float)state.Tp;
                // Rounding to single precision can carry 359.99999 up to 360.
                float direction = (float)state.FromDegrees;
                _direction[at] = direction >= 360f ? 0f : direction;
                _spread[at] = (float)state.SpreadDegrees;
            }
        });
    }

    /// <summary>Rounds every field in place to <paramref name="keptBits"/> significant mantissa bits (see <see cref="SignificantBitRounding"/>).</summary>
    public void RoundToSignificantBits(int keptBits)
    {
        SignificantBitRounding.Round(Hs, keptBits);
        SignificantBitRounding.Round(Te, keptBits);
        SignificantBitRounding.Round(Tp, keptBits);
        SignificantBitRounding.Round(Direction, keptBits);
        SignificantBitRounding.Round(Spread, keptBits);
        // A direction just below 360 may round up to it.
        var direction = Direction;
        for (int i = 0; i < direction.Length; i++)
            if (direction[i] >= 360f) direction[i] = 0f;
    }
}
