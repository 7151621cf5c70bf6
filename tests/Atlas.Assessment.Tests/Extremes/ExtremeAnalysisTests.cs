using Atlas.Assessment.Extremes;
using Atlas.Statistics;

namespace Atlas.Assessment.Tests.Extremes;

public class ExtremeAnalysisTests
{
    private const long Hour = 3600;
    private static readonly long Start2001 = UnixSeconds.Of(new DateTime(2001, 1, 1, 0, 0, 0, DateTimeKind.Utc));
    private static readonly long Start2025 = UnixSeconds.Of(new DateTime(2025, 1, 1, 0, 0, 0, DateTimeKind.Utc));

    /// <summary>A 3-hourly series, 2001-2024, quiet at 1 m, with one storm a year whose peak is known.</summary>
    private static (RegularSeries Series, double[] Maxima) YearlyStorms()
    {
        int count = (int)((Start2025 - Start2001) / (3 * Hour));
        var values = Enumerable.Repeat(1.0, count).ToArray();
        double[] maxima = [.. SeededSamples.Uniform(31, 24, 0, 1).Select(u => new GevDistribution(5, 1, 0.05).Quantile(u))];
        for (int year = 0; year < 24; year++)
        {
            long peakTime = UnixSeconds.Of(new DateTime(2001 + year, 1 + year % 12, 10, 12, 0, 0, DateTimeKind.Utc));
            int index = (int)((peakTime - Start2001) / (3 * Hour));
            values[index] = maxima[year];
            values[index - 1] = values[index + 1] = 0.5 * (1 + maxima[year]);
        }
        return (new RegularSeries(Start2001, 3 * Hour, values), maxima);
    }

    [Fact]
    public void AnnualMaximaNeedTheMinimumCoverage()
    {
        var (series, maxima) = YearlyStorms();
        var values = series.Values.ToArray();
        // Blank out 40 days of 2003 (coverage 325/365 = 0.89 < 0.9) and 30 days of 2004 (336/366 = 0.918).
        int Index(int year, int day) => (int)((UnixSeconds.Of(new DateTime(year, 1, 1, 0, 0, 0, DateTimeKind.Utc).AddDays(day)) - Start2001) / (3 * Hour));
        for (int i = Index(2003, 200); i < Index(2003, 240); i++) values[i] = double.NaN;
        for (int i = Index(2004, 200); i < Index(2004, 230); i++) values[i] = double.NaN;

        var sample = AnnualMaxima.Extract(new RegularSeries(series.StartUnixSeconds, series.StepSeconds, values));

        Assert.Equal(23, sample.Maxima.Count);
        var rejected = Assert.Single(sample.RejectedYears);
        Assert.Equal(2003, rejected.Year);
        Assert.Equal(325.0 / 365.0, rejected.Coverage, 1e-12);
        Assert.Equal(336.0 / 366.0, sample.Maxima.Single(m => m.Year == 2004).Coverage, 1e-12);
        Assert.Equal(maxima.Where((_, i) => i != 2), sample.Values());
    }

    [Fact]
    public void PartialFirstAndLastYearsAreLeftOut()
    {
        // July 2001 to June 2003, hourly: 2002 is the only full year.
        long start = UnixSeconds.Of(new DateTime(2001, 7, 1, 0, 0, 0, DateTimeKind.Utc));
        var series = new RegularSeries(start, Hour, Enumerable.Repeat(1.0, 2 * 8760).ToArray());

        var sample = AnnualMaxima.Extract(series);

        Assert.Equal([2002], sample.Maxima.Select(m => m.Year));
        Assert.Equal([2001, 2003], sample.RejectedYears.Select(r => r.Year));
    }

    [Fact]
    public void AnnualMaximaAnalysisFitsBothDistributionsAndCautionsLongPeriods()
    {
        var (series, maxima) = YearlyStorms();

        var result = AnnualMaximaAnalysis.Run(series);

        Assert.Equal(maxima, result.Sample.Values());
        Assert.Equal(GevMaximumLikelihood.FitGev(maxima).Distribution, result.Gev.Distribution);
        Assert.Equal([1.0, 5, 10, 50, 100], result.GevReturnLevels.Select(l => l.ReturnPeriodYears));
        Assert.True(double.IsNaN(result.GevReturnLevels[0].Level));   // 1 year: undefined from annual maxima
        Assert.True(double.IsNaN(result.GumbelReturnLevels[0].Level));
        // 24-year record: 100 years is beyond 4 record lengths (96 years), 50 years is not (common practice rule).
        Assert.True(result.GevReturnLevels[4].IsLongExtrapolation);
        Assert.False(result.GevReturnLevels[3].IsLongExtrapolation);
        Assert.Equal(ExtremeCautionKind.General, result.Cautions[0].Kind);
        Assert.Contains(result.Cautions, c => c.Kind == ExtremeCautionKind.LongExtrapolation && c.Text.StartsWith("STRONG CAUTION") && c.Text.Contains("100-year"));
        Assert.Contains(result.Cautions, c => c.Kind == ExtremeCautionKind.UndefinedLevel && c.Text.StartsWith("1-year"));
        Assert.Equal(24, result.GevDiagnostics.Count);
    }

    [Fact]
    public void ShortRecordIsRefusedForAnnualMaximaWithAPointerToPeaksOverThreshold()
    {
        var series = new RegularSeries(Start2001, Hour, Enumerable.Repeat(1.0, 3 * 8760).ToArray());

        var failure = Assert.Throws<ArgumentException>(() => AnnualMaximaAnalysis.Run(series));
        Assert.Contains("peaks over threshold", failure.Message);
    }

    /// <summary>2001-2012 (12 mean years of 8766 h exactly), 3-hourly, six storms a year peaking above 3 m.</summary>
    private static (RegularSeries Series, double[] Peaks) SixStormsAYear()
    {
        long end = UnixSeconds.Of(new DateTime(2013, 1, 1, 0, 0, 0, DateTimeKind.Utc));
        int count = (int)((end - Start2001) / (3 * Hour));
        var values = Enumerable.Repeat(1.0, count).ToArray();
        double[] peaks = [.. SeededSamples.Uniform(41, 72, 0, 1).Select(u => 3.0 + new GeneralizedParetoDistribution(0.7, 0.05).Quantile(u))];
        int spacing = count / 72; // about 61 days between storms
        for (int k = 0; k < 72; k++)
        {
            int index = k * spacing + spacing / 2;
            values[index] = peaks[k];
            values[index - 1] = values[index + 1] = 3.0 + 0.5 * (peaks[k] - 3.0); // shoulders above the threshold too
        }
        return (new RegularSeries(Start2001, 3 * Hour, values), peaks);
    }

    [Fact]
    public void PeaksOverThresholdFindsEachStormOnceAndItsRate()
    {
        var (series, peaks) = SixStormsAYear();

        var result = PeaksOverThresholdAnalysis.Run(series, new PeaksOverThresholdOptions { Threshold = 3.0 });

        Assert.Equal(72, result.Peaks.Count);
        Assert.Equal(peaks, result.Peaks.Select(p => p.PeakValue));
        Assert.Equal(12.0, result.RecordYears, 1e-12);
        Assert.Equal(6.0, result.ExceedancesPerYear, 1e-12);
        Assert.True(double.IsNaN(result.ThresholdQuantile));
        Assert.Equal(GpdMaximumLikelihood.Fit(peaks, 3.0, 6.0).Distribution, result.Fit.Distribution);
        // With six storms a year the 1-year level is defined from the peaks (λT = 6 > 1) and lies above the threshold.
        Assert.True(result.ReturnLevels[0].Level > 3.0);
        Assert.True(result.ReturnLevels[0].Level < result.ReturnLevels[1].Level);
        Assert.True(result.ReturnLevels[4].IsLongExtrapolation); // 100 > 4 x 12 years
        Assert.False(result.ReturnLevels[2].IsLongExtrapolation);
        Assert.Equal(ExtremeCautionKind.General, result.Cautions[0].Kind);
        Assert.Contains(result.Cautions, c => c.Kind == ExtremeCautionKind.LongExtrapolation && c.Text.Contains("50, 100-year"));
    }

    [Fact]
    public void DefaultThresholdIsTheNinetyNinthPercentile()
    {
        var (series, _) = SixStormsAYear();

        var result = PeaksOverThresholdAnalysis.Run(series);

        Assert.Equal(0.99, result.ThresholdQuantile);
        Assert.Equal(ExactQuantile.Of(series.Values, 0.99), result.Threshold);
        Assert.Equal(48, result.SeparationHours);
    }

    [Fact]
    public void ThresholdAboveEveryStormIsRefused()
    {
        var (series, _) = SixStormsAYear();

        var failure = Assert.Throws<ArgumentException>(() => PeaksOverThresholdAnalysis.Run(series, new PeaksOverThresholdOptions { Threshold = 50 }));
        Assert.Contains("Lower the threshold", failure.Message);
    }

    [Fact]
    public void SmallSampleCautionNamesTheCount()
    {
        var cautions = ExtremeCaution.Assess("test fit", 8, 8, ExtremeCaution.SmallAnnualMaximaSample, []);

        Assert.Equal(ExtremeCautionKind.General, cautions[0].Kind);
        Assert.Contains(cautions, c => c.Kind == ExtremeCautionKind.SmallSample && c.Text.StartsWith("Only 8 values"));
    }
}
