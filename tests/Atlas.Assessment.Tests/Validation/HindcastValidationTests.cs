using Atlas.Assessment.Validation;
using Atlas.Statistics;

namespace Atlas.Assessment.Tests.Validation;

public class HindcastValidationTests
{
    private static long At(int year, int month, int day) => UnixSeconds.Of(new DateTime(year, month, day, 0, 0, 0, DateTimeKind.Utc));

    [Fact]
    public void SeasonsGatherTheirMonthsAcrossYears()
    {
        // Hand-assigned: December 2020 and January/February 2021 are DJF; May is MAM; July JJA; October SON.
        long[] times = [At(2020, 12, 5), At(2021, 1, 5), At(2021, 2, 5), At(2021, 5, 5), At(2021, 7, 5), At(2021, 10, 5), At(2021, 12, 31)];
        double[] observed = [1, 2, 3, 4, 5, 6, 7];
        double[] modelled = [1.5, 2.5, 3.5, 4, 5, 6, 8];
        var report = HindcastValidation.Assess(MatchedSeries.FromPairs(times, observed, modelled, false));

        var djf = report.BySeason.Single(s => s.Season == AtlasPeriod.Djf).Scores;
        Assert.Equal(4, djf.Count);
        Assert.Equal((0.5 + 0.5 + 0.5 + 1.0) / 4, djf.Bias, 1e-12);
        Assert.Equal(1, report.BySeason.Single(s => s.Season == AtlasPeriod.Mam).Scores.Count);
        Assert.Equal(0.0, report.BySeason.Single(s => s.Season == AtlasPeriod.Son).Scores.Bias);
        Assert.Equal(7, report.Overall.Count);
    }

    [Fact]
    public void ObservedHeightClassesRunFromEachBoundToTheNextWithAnOpenLastClass()
    {
        double[] observed = [0.2, 0.99, 1.0, 2.5, 3.9, 4.0, 7.5];
        var times = Enumerable.Range(0, observed.Length).Select(i => At(2021, 1, 1) + i * 3600L).ToArray();
        var report = HindcastValidation.Assess(MatchedSeries.FromPairs(times, observed, observed, false));

        Assert.Equal([2, 1, 1, 1, 2], report.ByObservedClass.Select(c => c.Scores.Count));
        Assert.True(double.IsPositiveInfinity(report.ByObservedClass[^1].UpperBound));
        Assert.Equal(99, report.Quantiles.Count);
        Assert.Equal(observed.Length, report.Pairs.Count);
    }

    [Fact]
    public void DirectionSeriesGetsCircularScoresPerSeason()
    {
        long[] times = [At(2021, 1, 1), At(2021, 7, 1)];
        var report = HindcastValidation.AssessDirection(MatchedSeries.FromPairs(times, [350, 90], [10, 80], true));

        Assert.Equal(20.0, report.BySeason.Single(s => s.Season == AtlasPeriod.Djf).Scores.CircularBiasDegrees, 1e-9);
        Assert.Equal(-10.0, report.BySeason.Single(s => s.Season == AtlasPeriod.Jja).Scores.CircularBiasDegrees, 1e-9);
        Assert.Throws<ArgumentException>(() => HindcastValidation.Assess(report.Pairs));
    }
}
