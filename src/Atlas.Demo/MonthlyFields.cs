namespace Atlas.Demo;

/// <summary>
/// One calendar month of hindcast fields on the full grid, time-major
/// (<c>[time, row, column]</c>, rows south to north), single precision, land cells holding
/// <see cref="FillValue"/>.
/// </summary>
public sealed class MonthlyFields
{
    /// <summary>The value land cells hold in every field.</summary>
    public const float FillValue = -999f;

    /// <summary>First day of the month (UTC).</summary>
    public DateTime Month { get; }

    /// <summary>Instant of each step (UTC).</summary>
    public DateTime[] Times { get; }

    /// <summary>Significant wave height Hm0, m.</summary>
    public float[] Hs { get; }

    /// <summary>Energy period Tm-1,0, s.</summary>
    public float[] Te { get; }

    /// <summary>Peak period, s.</summary>
    public float[] Tp { get; }

    /// <summary>Mean direction the waves come from, degrees true.</summary>
    public float[] Direction { get; }

    /// <summary>Directional spread, degrees.</summary>
    public float[] Spread { get; }

    private MonthlyFields(DateTime month, DateTime[] times, int cells)
    {
        Month = month;
        Times = times;
        Hs = new float[times.Length * cells];
        Te = new float[times.Length * cells];
        Tp = new float[times.Length * cells];
        Direction = new float[times.Length * cells];
        Spread = new float[times.Length * cells];
    }

    /// <summary>
    /// Evaluates <paramref name="model"/> at every step of the month starting at
    /// <paramref name="month"/>, every <paramref name="stepHours"/> hours from midnight on the 1st.
    /// Cells are independent, so the parallel loop gives the same values on every run.
    /// </summary>
    public static MonthlyFields Generate(SeaStateModel model, DateTime month, int stepHours)
    {
        ArgumentNullException.ThrowIfNull(model);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(stepHours);
        var grid = model.Grid;
        int cells = grid.Columns * grid.Rows;
        int steps = (int)(month.AddMonths(1) - month).TotalHours / stepHours;
        var times = new DateTime[steps];
        for (int s = 0; s < steps; s++) times[s] = month.AddHours(s * stepHours);
        var fields = new MonthlyFields(month, times, cells);
        for (int c = 0; c < cells; c++)
        {
            if (!grid.IsLand[c]) continue;
            for (int s = 0; s < steps; s++)
            {
                int at = s * cells + c;
                fields.Hs[at] = fields.Te[at] = fields.Tp[at] = fields.Direction[at] = fields.Spread[at] = FillValue;
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
                fields.Hs[at] = (float)state.Hs;
                fields.Te[at] = (float)state.Te;
                fields.Tp[at] = (float)state.Tp;
                // Rounding to single precision can carry 359.99999 up to 360.
                float direction = (float)state.FromDegrees;
                fields.Direction[at] = direction >= 360f ? 0f : direction;
                fields.Spread[at] = (float)state.SpreadDegrees;
            }
        });
        return fields;
    }

    /// <summary>Rounds every field in place to <paramref name="keptBits"/> significant mantissa bits (see <see cref="SignificantBitRounding"/>).</summary>
    public void RoundToSignificantBits(int keptBits)
    {
        foreach (var field in new[] { Hs, Te, Tp, Direction, Spread })
            SignificantBitRounding.Round(field, keptBits);
        // A direction just below 360 may round up to it.
        for (int i = 0; i < Direction.Length; i++)
            if (Direction[i] >= 360f) Direction[i] = 0f;
    }
}
