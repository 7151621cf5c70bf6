using System.Runtime.CompilerServices;
using Atlas.Statistics;
using Atlas.Storage.Statistics;

namespace Atlas.Ingest.Statistics;

/// <summary>
/// Flattens a cell's statistics into stored rows: one per period and parameter (hs, te, tp, j, spread, d, dir).
/// The hs and j rows carry their exceedance fractions in <c>Fractions</c>; the dir row carries the power-weighted mean
/// direction in <c>mean</c>, the circular spread of directions in <c>sd</c> and the 16-sector power rose in <c>Fractions</c>.
/// A parameter with no valid step in the whole cell is left out.
/// </summary>
public static class StatisticRows
{
    private static readonly WaveParameter[] Summarised = [WaveParameter.Hs, WaveParameter.Te, WaveParameter.Tp, WaveParameter.J, WaveParameter.Spread, WaveParameter.D];

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static void Append(int cellId, BinnedCellResults statistics, List<StatisticRow> rows)
    {
        int annual = statistics.IndexOf(AtlasPeriod.Annual);
        for (int i = 0; i < statistics.PeriodCount; i++)
        {
            ref readonly PeriodResult period = ref statistics.Period(i);
            foreach (var parameter in Summarised)
            {
                if (annual >= 0 && statistics.Period(annual).Summary(parameter).Count == 0 && parameter != WaveParameter.Hs) continue;
                var s = period.Summary(parameter);
                float[]? extra = parameter switch
                {
                    WaveParameter.Hs => Singles(statistics.HsExceedance(i)),
                    WaveParameter.J => Singles(statistics.PowerExceedance(i)),
                    _ => null,
                };
                rows.Add(new StatisticRow(cellId, period.Period, parameter, F(s.Mean), F(s.Sd), F(s.Min), F(s.Max),
                    F(s.P10), F(s.P50), F(s.P90), F(s.P99), (int)s.Count, (float)s.Coverage, extra));
            }
            if (annual >= 0 && statistics.Period(annual).Direction.Count == 0) continue;
            var d = period.Direction;
            rows.Add(new StatisticRow(cellId, period.Period, WaveParameter.Dir, F(d.Mean), F(d.Spread), null, null, null, null, null, null,
                (int)d.Count, (float)d.Coverage, Singles(statistics.PowerRose(i))));
        }
    }

    private static float? F(double value) => double.IsFinite(value) ? (float)value : null;

    private static float[] Singles(ReadOnlySpan<double> values)
    {
        var singles = new float[values.Length];
        for (var i = 0; i < singles.Length; i++) singles[i] = (float)values[i];
        return singles;
    }
}
