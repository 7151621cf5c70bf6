using Atlas.Statistics;
using MathNet.Numerics.Statistics;

namespace Atlas.Assessment.Yield;

/// <summary>Energy production of a wave device from its power matrix.</summary>
/// <remarks>
/// Power is evaluated per step and then averaged, never from mean Hs and mean period. Steps with Hs
/// or period missing are left out and counted; sea states outside the matrix produce 0 kW and are
/// counted. Annual energy uses a mean year of 8766 h (365.25 days).
/// </remarks>
public static class DeviceYield
{
    /// <summary>The method in words, for the notes of every answer and layer built on it.</summary>
    public const string MethodNote =
        "power read from the matrix at every step's Hs and period, then averaged over the valid steps; annual energy = mean power x 8766 h " +
        "(a mean year of 365.25 days); capacity factor = mean power / rated power; a month's energy = its mean power x its mean length " +
        "(February 28.25 days); a year's energy = its mean power x its hours, counted complete at 90 % coverage; the inter-annual coefficient " +
        "of variation is the sample standard deviation over the mean of the complete years' energy. Missing steps are left out and counted.";

    /// <summary>Power per step, kW: NaN where Hs or period is missing, 0 outside the matrix.</summary>
    /// <exception cref="ArgumentException">The spans differ in length.</exception>
    public static double[] PowerPerStep(PowerMatrix matrix, ReadOnlySpan<double> hsMetres, ReadOnlySpan<double> periodSeconds, PowerMatrixInterpolation interpolation)
    {
        ArgumentNullException.ThrowIfNull(matrix);
        if (hsMetres.Length != periodSeconds.Length)
            throw new ArgumentException($"{hsMetres.Length} Hs values but {periodSeconds.Length} period values.", nameof(periodSeconds));
        var power = new double[hsMetres.Length];
        for (int i = 0; i < power.Length; i++)
            power[i] = matrix.PowerKw(hsMetres[i], periodSeconds[i], interpolation);
        return power;
    }

    /// <summary>Production over aligned Hs and period series.</summary>
    /// <param name="matrix">The device's power matrix.</param>
    /// <param name="hs">Hs series, m.</param>
    /// <param name="period">Period series on the same times, s.</param>
    /// <param name="periodKind">Which period <paramref name="period"/> holds; must be the matrix's (convert Tp to Te, or
    /// back, before calling).</param>
    /// <param name="options">Interpolation and year coverage.</param>
    /// <exception cref="ArgumentException">The period kinds differ or the series are not aligned.</exception>
    public static SeriesYield FromSeries(PowerMatrix matrix, RegularSeries hs, RegularSeries period, WavePeriodKind periodKind, YieldOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(matrix);
        ArgumentNullException.ThrowIfNull(hs);
        ArgumentNullException.ThrowIfNull(period);
        options ??= new YieldOptions();
        RequireKind(matrix, periodKind, "period series");
        hs.RequireAlignedWith(period, nameof(period));

        double[] power = PowerPerStep(matrix, hs.Values, period.Values, options.Interpolation);
        int valid = 0, outside = 0;
        double sum = 0;
        var hsValues = hs.Values;
        var periodValues = period.Values;
        for (int i = 0; i < power.Length; i++)
        {
            if (double.IsNaN(power[i])) continue;
            valid++;
            sum += power[i];
            if (!matrix.Contains(hsValues[i], periodValues[i])) outside++;
        }
        double meanPower = valid > 0 ? sum / valid : double.NaN;

        var monthSums = new double[12];
        var monthCounts = new int[12];
        var years = new List<YearlyYield>();
        int currentYear = int.MinValue, yearValid = 0;
        double yearSum = 0;
        void CloseYear()
        {
            if (currentYear == int.MinValue) return;
            double hours = CalendarHours.InYear(currentYear);
            double coverage = Math.Min(1.0, yearValid * hs.StepHours / hours);
            double yearMean = yearValid > 0 ? yearSum / yearValid : double.NaN;
            years.Add(new YearlyYield(currentYear, yearValid, coverage, yearMean, yearMean * hours / 1000.0, coverage >= options.MinimumYearCoverage));
        }
        foreach (var (year, month, start, end) in hs.MonthBlocks())
        {
            if (year != currentYear)
            {
                CloseYear();
                currentYear = year;
                yearValid = 0;
                yearSum = 0;
            }
            for (int i = start; i < end; i++)
            {
                if (double.IsNaN(power[i])) continue;
                monthSums[month - 1] += power[i];
                monthCounts[month - 1]++;
                yearSum += power[i];
                yearValid++;
            }
        }
        CloseYear();

        var months = Enumerable.Range(1, 12).Select(m =>
        {
            double mean = monthCounts[m - 1] > 0 ? monthSums[m - 1] / monthCounts[m - 1] : double.NaN;
            return new MonthlyYield(m, monthCounts[m - 1], mean, mean * CalendarHours.InMeanMonth(m) / 1000.0);
        }).ToArray();

        double[] complete = [.. years.Where(y => y.IsComplete).Select(y => y.EnergyMwh)];
        double variation = complete.Length >= 2 ? complete.StandardDeviation() / complete.Mean() : double.NaN;

        return new SeriesYield(
            matrix.Name, options.Interpolation, matrix.RatedPowerKw,
            power.Length, valid, power.Length - valid, outside,
            valid > 0 ? (double)outside / valid : double.NaN,
            meanPower, meanPower * CalendarHours.PerMeanYear / 1000.0, meanPower / matrix.RatedPowerKw,
            months, years, variation, complete.Length);
    }

    private static void RequireKind(PowerMatrix matrix, WavePeriodKind given, string what)
    {
        if (given != matrix.PeriodKind)
            throw new ArgumentException(
                $"Power matrix '{matrix.Name}' is over {Describe(matrix.PeriodKind)} but the {what} holds {Describe(given)}; convert the period first.");
    }

    private static string Describe(WavePeriodKind kind) => kind == WavePeriodKind.EnergyPeriod ? "Te (energy period)" : "Tp (peak period)";
}
