using System.Globalization;
using Atlas.WavePhysics;
using Atlas.TestSupport;

namespace Atlas.Statistics.Tests;

/// <summary>
/// A record that starts in July: coverage against the calendar, month-balanced climatology, contiguous winters, and
/// the same statistics from CDO (Debian package cdo) on the same series written by netCDF4-python.
/// </summary>
public class CalendarTrueCoverageTests
{
    private const double PowerCoefficient = 1025 * 9.81 * 9.81 / (64 * Math.PI) / 1000; // deep water, rho g^2 / (64 pi), kW/m

    /// <summary>Hourly, 1 July 2001 to 31 December 2003, the same annual cycle every year (no leap year in it).</summary>
    private static (long[] Times, float[] Hs, float[] Te) JulyStart()
    {
        long start = new DateTimeOffset(2001, 7, 1, 0, 0, 0, TimeSpan.Zero).ToUnixTimeSeconds();
        long end = new DateTimeOffset(2004, 1, 1, 0, 0, 0, TimeSpan.Zero).ToUnixTimeSeconds();
        int n = (int)((end - start) / 3600);
        var times = new long[n];
        var hs = new float[n];
        var te = new float[n];
        for (int k = 0; k < n; k++)
        {
            times[k] = start + 3600L * k;
            DateTime t = DateTimeOffset.FromUnixTimeSeconds(times[k]).UtcDateTime;
            double phase = 2 * Math.PI * (t.DayOfYear - 1 + t.Hour / 24.0) / 365;
            hs[k] = (float)Math.Round(2 + 0.8 * Math.Cos(phase) + 0.6 * Math.Sin(phase) + 0.3 * Math.Sin(3 * phase + t.Hour), 3);
            te[k] = (float)Math.Round(6 + 1.5 * hs[k], 2);
        }
        return (times, hs, te);
    }

    private static CellSeries Series((long[] Times, float[] Hs, float[] Te) data) =>
        new() { Times = data.Times, Hs = data.Hs, Te = data.Te, DepthMetres = double.NaN };

    // Coverage rule (tests/data/README.md): a period expects the calendar hours of its months within the record's years. 2001 holds
    // July to December only: 4,416 of 8,760 hours, flagged; January holds two of three Januaries; JJA lacks June 2001.
    [Fact]
    public void PartialYearsSeasonsAndMonthsCarryTheirCalendarCoverage()
    {
        var data = JulyStart();
        foreach (IReadOnlyList<PeriodStatistics> periods in new[]
                 {
                     new BinnedCellCalculator().Compute(Series(data)).Periods,
                     ExactPointAnalysis.Analyse(Series(data)).Periods,
                 })
        {
            PeriodStatistics Of(AtlasPeriod p) => periods.Single(s => s.Period == p);
            Assert.Equal((8760L, 4416L), (Of(AtlasPeriod.Year(2001)).ExpectedSteps, Of(AtlasPeriod.Year(2001)).Hs.Count));
            Assert.Equal(4416 / 8760.0, Of(AtlasPeriod.Year(2001)).J.Coverage, 1e-15);
            Assert.True(Of(AtlasPeriod.Year(2001)).LowCoverage);
            Assert.False(Of(AtlasPeriod.Year(2002)).LowCoverage);
            Assert.Equal(2 / 3.0, Of(AtlasPeriod.Month(1)).J.Coverage, 1e-15);
            Assert.True(Of(AtlasPeriod.Month(1)).LowCoverage);
            Assert.Equal(1.0, Of(AtlasPeriod.Month(7)).J.Coverage, 1e-15);
            Assert.Equal((2 * 92 * 24 + 62 * 24) / (3.0 * 92 * 24), Of(AtlasPeriod.Jja).J.Coverage, 1e-15);
            Assert.Equal(3 * 8760L, Of(AtlasPeriod.Annual).ExpectedSteps);
        }
    }

    // Month-balanced climatology (MethodNotes.Climatology): with the same cycle every year, the annual mean, the
    // exceedance fractions and the percentiles equal those of any whole year (2002), where the pooled mean of the
    // record leans to the months it holds three times. Means and fractions to rounding; the exact percentiles, on
    // weighted ranks, within 0.005 m of the whole year's (the record repeats each value two or three times).
    [Fact]
    public void ClimatologyOfAPartialRecordEqualsAWholeYear()
    {
        var data = JulyStart();
        ExactPointStatistics point = ExactPointAnalysis.Analyse(Series(data));
        BinnedCellStatistics layer = new BinnedCellCalculator().Compute(Series(data));
        PeriodStatistics year = point.Find(AtlasPeriod.Year(2002))!;
        foreach (PeriodStatistics annual in new[] { point.Find(AtlasPeriod.Annual)!, layer.Find(AtlasPeriod.Annual)! })
        {
            Assert.Equal(year.Hs.Mean, annual.Hs.Mean, 1e-9);
            Assert.Equal(year.J.Mean, annual.J.Mean, 1e-9 * year.J.Mean);
            Assert.Equal(year.Hs.Sd, annual.Hs.Sd, 1e-9);
            for (int t = 0; t < year.HsExceedance.Count; t++) Assert.Equal(year.HsExceedance[t].Fraction, annual.HsExceedance[t].Fraction, 1e-12);
        }
        PeriodStatistics exact = point.Find(AtlasPeriod.Annual)!;
        Assert.Equal(year.Hs.P50, exact.Hs.P50, 0.005);
        Assert.Equal(year.Hs.P90, exact.Hs.P90, 0.005);
        Assert.Equal(year.Hs.P90, layer.Find(AtlasPeriod.Annual)!.Hs.P90, 0.01 + 0.005); // layer: one 0.01 m bin more
        double pooled = data.Hs.Select(v => (double)v).Average();
        Assert.True(Math.Abs(pooled - year.Hs.Mean) > 0.02, $"the pooled mean {pooled} would lean to the second half of the year");
    }

    // Inter-annual variability uses complete years only: a climate with no year-to-year change has a coefficient of
    // variation of 0, and 2001 is listed, flagged and left out.
    [Fact]
    public void InterAnnualVariabilityLeavesOutPartialYears()
    {
        ExactPointStatistics point = ExactPointAnalysis.Analyse(Series(JulyStart()));
        InterAnnualSeries annual = point.InterAnnual.Single(s => s.Period == AtlasPeriod.Annual);
        Assert.Equal([2001, 2002, 2003], annual.Years.Select(y => y.Year));
        Assert.Equal([2001], annual.YearsLeftOut);
        Assert.Equal(2, annual.YearsUsed);
        Assert.Equal(0, annual.JCoefficientOfVariation, 1e-9);
        InterAnnualSeries winter = point.InterAnnual.Single(s => s.Period == AtlasPeriod.Djf);
        // Winters: 2002 (Dec 2001 - Feb 2002), 2003, and 2004 (Dec 2003 only, flagged).
        Assert.Equal(["2001-12/2002-02", "2002-12/2003-02", "2003-12/2004-02"], winter.Years.Select(y => y.Label));
        Assert.Equal([2004], winter.YearsLeftOut);
        Assert.Equal(31 / (31 + 31 + 29.0), winter.Years[^1].Coverage, 1e-15); // February 2004 has 29 days
    }

    // Whole winters: winters alternate between Hs 3 m and 1 m (the winter of Y is December Y-1 to February Y), other
    // months 2 m, 6-hourly from January 2001 to December 2010. The complete winters 2002..2010 are 3, 1, 3, ..., 3:
    // numpy.std(v, ddof=1) / numpy.mean(v) = 0.49930699897395464 (computed with NumPy 1.24). The winter of 2001
    // lacks its December and the winter of 2011 is its December alone: both flagged and left out.
    [Fact]
    public void PerYearWintersAreContiguous()
    {
        long start = new DateTimeOffset(2001, 1, 1, 0, 0, 0, TimeSpan.Zero).ToUnixTimeSeconds();
        long end = new DateTimeOffset(2011, 1, 1, 0, 0, 0, TimeSpan.Zero).ToUnixTimeSeconds();
        int n = (int)((end - start) / 21600);
        long[] times = [.. Enumerable.Range(0, n).Select(k => start + 21600L * k)];
        float[] hs = [.. times.Select(t =>
        {
            DateTime d = DateTimeOffset.FromUnixTimeSeconds(t).UtcDateTime;
            int winter = d.Month == 12 ? d.Year + 1 : d.Year;
            return d.Month is 12 or 1 or 2 ? (winter % 2 == 0 ? 3f : 1f) : 2f;
        })];
        float[] te = [.. hs.Select(_ => 8f)];
        ExactPointStatistics point = ExactPointAnalysis.Analyse(new CellSeries { Times = times, Hs = hs, Te = te, DepthMetres = double.NaN });
        InterAnnualSeries djf = point.InterAnnual.Single(s => s.Period == AtlasPeriod.Djf);
        Assert.Equal(Enumerable.Range(2001, 11), djf.Years.Select(y => y.Year));
        Assert.Equal([2001, 2011], djf.YearsLeftOut);
        Assert.Equal("2000-12/2001-02", djf.Years[0].Label);
        Assert.Equal(0.49930699897395464, djf.HsCoefficientOfVariation, 1e-12);
        Assert.All(djf.Years.Where(y => !y.LowCoverage), y => Assert.Equal(y.Year % 2 == 0 ? 3 : 1, y.Hs, 1e-12));
    }

    // CDO on the same series (netCDF4-python writes it; cdo -b F64): ymonmean equals the monthly means, yearmean the
    // year periods, and seasmean, which averages each run of adjacent steps of one season (its DJF joins December to
    // the following January and February), the per-year seasons of the inter-annual table; all to 1e-6 relative.
    // yseasmean and timmean pool the steps (three Decembers, two Januaries): the atlas's month-balanced DJF and annual
    // equal instead the month means of ymonmean weighted by each month's calendar hours over the record's years
    // (numpy.average), and the pooled values differ from them.
    [Fact]
    public void RecordStartingInJulyAgreesWithCdo()
    {
        var data = JulyStart();
        using var python = new NumPyReference();
        python.Write<long>("times.i64", data.Times).Write<float>("hs.f32", data.Hs).Write<float>("te.f32", data.Te);
        string file = Path.Combine(python.Folder, "series.nc");
        ExternalTool.Run("/usr/bin/python3", Path.Combine(AppContext.BaseDirectory, "data", "statistics", "write_series_netcdf.py"), python.Folder, file);
        string withPower = Path.Combine(python.Folder, "j.nc");
        ExternalTool.Run("cdo", "-s", "-O", "-b", "F64",
            $"-expr,hs=hs;te=te;j={PowerCoefficient.ToString("R", CultureInfo.InvariantCulture)}*hs*hs*te", file, withPower);
        List<(DateTime Date, double Value)> Cdo(string operation, string name) =>
            [.. ExternalTool.Run("cdo", "-s", "-b", "F64", "-outputtab,date,value", $"-{operation}", $"-selname,{name}", withPower)
                .Split('\n', StringSplitOptions.RemoveEmptyEntries).Where(l => !l.TrimStart().StartsWith('#'))
                .Select(l => l.Split(' ', StringSplitOptions.RemoveEmptyEntries))
                .Select(p => (DateTime.Parse(p[0], CultureInfo.InvariantCulture), double.Parse(p[1], CultureInfo.InvariantCulture)))];

        ExactPointStatistics point = ExactPointAnalysis.Analyse(Series(data));
        BinnedCellStatistics layer = new BinnedCellCalculator().Compute(Series(data));
        void Same(double expected, double actual, string what) =>
            Assert.True(Math.Abs(expected - actual) <= 1e-6 * Math.Abs(expected), $"{what}: atlas {actual}, CDO {expected}");
        foreach (string name in new[] { "hs", "te", "j" })
        {
            var parameter = WaveParameterNames.Parse(name);
            var months = Cdo("ymonmean", name);
            Assert.Equal(12, months.Count);
            foreach (var (date, value) in months)
            {
                Same(value, point.Find(AtlasPeriod.Month(date.Month))!.Summary(parameter).Mean, $"ymonmean {name} {date:MM}");
                Same(value, layer.Find(AtlasPeriod.Month(date.Month))!.Summary(parameter).Mean, $"ymonmean {name} {date:MM} (layer)");
            }
            foreach (var (date, value) in Cdo("yearmean", name))
                Same(value, point.Find(AtlasPeriod.Year(date.Year))!.Summary(parameter).Mean, $"yearmean {name} {date.Year}");

            // seasmean: one value per run of adjacent steps of a season, dated inside the run.
            var seasons = Cdo("seasmean", name);
            Assert.Equal(11, seasons.Count); // JJA 2001 (July and August), SON 2001 .. SON 2003, and DJF 2003/04 (December 2003)
            foreach (var (date, value) in seasons)
            {
                AtlasPeriod season = AtlasPeriod.SeasonOf(date.Month);
                int seasonYear = date.Month == 12 ? date.Year + 1 : date.Year;
                YearlyMeans row = point.InterAnnual.Single(s => s.Period == season).Years.Single(y => y.Year == seasonYear);
                double atlas = name == "hs" ? row.Hs : name == "te" ? row.Te : row.J;
                Same(value, atlas, $"seasmean {name} {row.Label}");
            }

            // yseasmean and timmean pool; the atlas balances the months: numpy.average of the CDO month means.
            double[] monthMeans = [.. months.OrderBy(m => m.Date.Month).Select(m => m.Value)];
            double Balanced(IEnumerable<int> periodMonths)
            {
                double sum = 0, weights = 0;
                foreach (int m in periodMonths)
                {
                    double hours = Enumerable.Range(2001, 3).Sum(y => DateTime.DaysInMonth(y, m) * 24.0);
                    sum += hours * monthMeans[m - 1];
                    weights += hours;
                }
                return sum / weights;
            }
            double winter = Balanced([12, 1, 2]), year = Balanced(Enumerable.Range(1, 12));
            Same(winter, point.Find(AtlasPeriod.Djf)!.Summary(parameter).Mean, $"balanced djf {name}");
            Same(winter, layer.Find(AtlasPeriod.Djf)!.Summary(parameter).Mean, $"balanced djf {name} (layer)");
            Same(year, point.Find(AtlasPeriod.Annual)!.Summary(parameter).Mean, $"balanced annual {name}");
            Same(year, layer.Find(AtlasPeriod.Annual)!.Summary(parameter).Mean, $"balanced annual {name} (layer)");
            double pooledWinter = Cdo("yseasmean", name).Single(s => AtlasPeriod.SeasonOf(s.Date.Month) == AtlasPeriod.Djf).Value;
            double pooledYear = Cdo("timmean", name).Single().Value;
            Assert.True(Math.Abs(pooledWinter - winter) > 1e-3 * winter, $"yseasmean {name} pools: {pooledWinter} vs {winter}");
            Assert.True(Math.Abs(pooledYear - year) > 1e-3 * year, $"timmean {name} pools: {pooledYear} vs {year}");
        }
    }
}
