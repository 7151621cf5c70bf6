using Atlas.Statistics.Calendar;
using Atlas.WavePhysics;

namespace Atlas.Statistics.Spectral;

/// <summary>
/// Period means of the spectrum and of the directionally resolved power at a spectral output point, from its monthly
/// sums, and the period's directionality coefficient from them (IEC TS 62600-101: the largest period-mean J_theta over the
/// period-mean J).
/// </summary>
/// <remarks>
/// A calendar month (jan..dec) and a year pool their steps: the sums over the months, divided by their steps. A season
/// and the annual period are month-balanced as the exact statistics are (<see cref="MonthBalance"/>): each calendar month's
/// mean over its steps weighs by its calendar hours over the window's years that hold steps of it, so a record with two
/// Julys and one June does not lean towards summer. Only months inside the window count.
/// </remarks>
public static class PeriodSpectra
{
    public static IReadOnlyList<PeriodSpectrum> Of(IReadOnlyList<MonthSpectrum> months, IReadOnlyList<AtlasPeriod> periods, AnalysisWindow window,
        ReadOnlySpan<double> directionsFromDegrees)
    {
        window.Validate();
        var inside = months.Where(m => m.Steps > 0 && window.Contains(m.Year, m.Month)).ToList();
        var sweep = directionsFromDegrees.Length > 0 ? new ResolvedPowerSweep(directionsFromDegrees) : null;
        var result = new List<PeriodSpectrum>(periods.Count);
        foreach (var period in periods)
        {
            var members = inside.Where(m => Belongs(period, m)).ToList();
            if (members.Count == 0) continue;
            int nf = members[0].FrequencySum.Length, nd = members[0].DirectionSum.Length;
            var frequency = new double[nf];
            var direction = new double[nd];
            long steps = members.Sum(m => (long)m.Steps);
            if (period.Kind is PeriodKind.Season or PeriodKind.Annual)
            {
                // Month balance: each calendar month's own mean, weighted by its calendar hours over the years holding it.
                double totalWeight = 0;
                foreach (var group in members.GroupBy(m => m.Month))
                {
                    double hours = group.Sum(m => (double)DateTime.DaysInMonth(m.Year, m.Month) * 24);
                    long monthSteps = group.Sum(m => (long)m.Steps);
                    foreach (var m in group)
                    {
                        for (int i = 0; i < nf; i++) frequency[i] += hours * m.FrequencySum[i] / monthSteps;
                        for (int j = 0; j < nd; j++) direction[j] += hours * m.DirectionSum[j] / monthSteps;
                    }
                    totalWeight += hours;
                }
                for (int i = 0; i < nf; i++) frequency[i] /= totalWeight;
                for (int j = 0; j < nd; j++) direction[j] /= totalWeight;
            }
            else
            {
                foreach (var m in members)
                {
                    for (int i = 0; i < nf; i++) frequency[i] += m.FrequencySum[i];
                    for (int j = 0; j < nd; j++) direction[j] += m.DirectionSum[j];
                }
                for (int i = 0; i < nf; i++) frequency[i] /= steps;
                for (int j = 0; j < nd; j++) direction[j] /= steps;
            }
            var resolved = sweep is null ? new DirectionalPower(double.NaN, double.NaN, double.NaN, double.NaN) : sweep.Maximum(direction);
            result.Add(new PeriodSpectrum(period, steps, resolved.Coefficient, resolved.DirectionOfMaximumDegrees,
                sweep is null ? double.NaN : resolved.OmnidirectionalPower, frequency, direction));
        }
        return result;
    }

    private static bool Belongs(AtlasPeriod period, MonthSpectrum month) => period.Kind switch
    {
        PeriodKind.Annual => true,
        PeriodKind.Month => AtlasPeriod.Month(month.Month) == period,
        PeriodKind.Season => AtlasPeriod.SeasonOf(month.Month) == period,
        PeriodKind.Year => AtlasPeriod.Year(month.Year) == period,
        _ => false,
    };
}
