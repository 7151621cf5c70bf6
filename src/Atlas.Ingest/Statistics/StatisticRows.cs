using Atlas.Statistics;
using Atlas.Storage.Statistics;
using System.Runtime.CompilerServices;

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
    public static void Append(int cellId, BinnedCellStatistics statistics, List<StatisticRow> rows)
    {
        var annual = statistics.Find(AtlasPeriod.Annual);
        foreach (var period in statistics.Periods)
        {
            foreach (var parameter in Summarised)
            {
                if (annual is not null && annual.Summary(parameter).Count == 0 && parameter != WaveParameter.Hs) continue;
                var s = period.Summary(parameter);
                float[]? extra = parameter switch
                {
                    WaveParameter.Hs => Fractions(period.HsExceedance),
                    WaveParameter.J => Fractions(period.PowerExceedance),
                    _ => null,
                };
                rows.Add(new StatisticRow(cellId, period.Period, parameter, F(s.Mean), F(s.Sd), F(s.Min), F(s.Max),
                    F(s.P10), F(s.P50), F(s.P90), F(s.P99), (int)s.Count, (float)s.Coverage, extra));
            }
            if (annual is not null && annual.Direction.Count == 0) continue;
            var d = period.Direction;
            rows.Add(new StatisticRow(cellId, period.Period, WaveParameter.Dir, F(d.Mean), F(d.Spread), null, null, null, null, null, null,
                (int)d.Count, (float)d.Coverage, Singles(d.PowerRose)));
        }
    }

    private static float? F(double value) => double.IsFinite(value) ? (float)value : null;

    private static float[] Fractions(IReadOnlyList<ExceedanceFraction> exceedances)
    {
        var fractions = new float[exceedances.Count];
        for (var i = 0; i < fractions.Length; i++) fractions[i] = (float)exceedances[i].Fraction;
        return fractions;
    }

    private static float[] Singles(IReadOnlyList<double> values)
    {
        var singles = new float[values.Count];
        for (var i = 0; i < singles.Length; i++) singles[i] = (float)values[i];
        return singles;
    }
}
