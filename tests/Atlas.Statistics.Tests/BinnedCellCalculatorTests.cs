using System.Text.Json.Nodes;
using Atlas.WavePhysics;

namespace Atlas.Statistics.Tests;

/// <summary>Runs reference_statistics.py once for the standard invented series (finite depth, all parameters).</summary>
[CollectionDefinition(Name)]
public sealed class InventedSeriesCollection : ICollectionFixture<InventedSeriesReference>
{
    public const string Name = "Invented series and its NumPy reference";
}

public sealed class InventedSeriesReference
{
    public InventedSeriesReference()
    {
        Data = new InventedSeries();
        Expected = Data.Reference(Options);
    }

    public StatisticsOptions Options { get; } = new();
    internal InventedSeries Data { get; }
    public JsonNode Expected { get; }
}

[Collection(InventedSeriesCollection.Name)]
public class BinnedCellCalculatorTests(InventedSeriesReference reference)
{
    private static JsonObject Periods(JsonNode expected) => expected["periods"]!.AsObject();

    // NumPy groupby by calendar month, season (by calendar month across years), annual and year, in float64
    // (reference_statistics.py), seasons and annual month-balanced with numpy.average weights. Means of stored
    // single-precision values are computed in double, so they agree to 1e-12; power is stored per step in single
    // precision (and its group velocity tabulated to 1e-7), so 3e-7. Percentiles come from histograms: within one
    // bin width (0.01 m, 0.01 s, 0.1 kW/m, 0.1 degree). The period directionality coefficient against the script's
    // independent grid evaluation of the cosine-2s model (0.25-degree quadrature, 0.05-degree search): 1e-4 in d,
    // 0.1 degree in its direction.
    [Fact]
    public void PeriodStatisticsMatchNumPyGroupByForMonthsSeasonsAnnualAndYears()
    {
        BinnedCellStatistics actual = new BinnedCellCalculator(reference.Options).Compute(reference.Data.Series());
        JsonObject expected = Periods(reference.Expected);
        Assert.Equal(17 + 3, actual.Periods.Count);
        Assert.Equal(expected.Select(p => p.Key).Order(), actual.Periods.Select(p => p.Period.Name).Order());
        foreach (PeriodStatistics period in actual.Periods)
        {
            JsonNode e = expected[period.Period.Name]!;
            string name = period.Period.Name;
            Assert.Equal(e["expected"]!.GetValue<long>(), period.ExpectedSteps);
            ReferenceAssert.Summary(e["hs"], period.Hs, $"{name} hs", 1e-12, 0, 0.01 + 1e-9);
            ReferenceAssert.Summary(e["te"], period.Te, $"{name} te", 1e-12, 0, 0.01 + 1e-9);
            ReferenceAssert.Summary(e["tp"], period.Tp, $"{name} tp", 1e-12, 0, 0.01 + 1e-9);
            ReferenceAssert.Summary(e["spread"], period.Spread, $"{name} spread", 1e-12, 0, 0.1 + 1e-9);
            ReferenceAssert.Summary(e["j"], period.J, $"{name} j", 3e-7, 3e-7, 0.1 + 1e-4);
            Assert.Equal(e["dCount"]!.GetValue<long>(), period.D.Count);
            Assert.Equal(ReferenceAssert.Number(e["d"]), period.Direction.DirectionalityCoefficient, 1e-4);
            Assert.Equal(period.D.Mean, period.Direction.DirectionalityCoefficient);
            Assert.Equal(0, Math.IEEERemainder(ReferenceAssert.Number(e["dMaxFrom"]) - period.Direction.MaxPowerFromDeg, 360), 0.1);
        }
    }

    // Fractions of steps above the thresholds (numpy mean of v > t, compared in float32; seasons and annual
    // month-balanced, the weight above over the total). Hs to rounding (1e-12); power may sit
    // on the other side of a threshold at a step because of single-precision storage, so within 2 steps.
    [Fact]
    public void ExceedanceFractionsMatchNumPy()
    {
        BinnedCellStatistics actual = new BinnedCellCalculator(reference.Options).Compute(reference.Data.Series());
        foreach (PeriodStatistics period in actual.Periods)
        {
            JsonNode e = Periods(reference.Expected)[period.Period.Name]!;
            for (int t = 0; t < period.HsExceedance.Count; t++)
                Assert.Equal(ReferenceAssert.Number(e["hsExceedance"]![t]), period.HsExceedance[t].Fraction, 1e-12);
            for (int t = 0; t < period.PowerExceedance.Count; t++)
                Assert.Equal(ReferenceAssert.Number(e["jExceedance"]![t]), period.PowerExceedance[t].Fraction, 2.0 / period.J.Count);
        }
    }

    // Power-weighted circular mean and spread from numpy sums of J cos, J sin, and the 16-sector rose from
    // numpy.bincount of floor(((dir + 11.25) % 360) / 22.5) weighted by J. The weights are single-precision power,
    // so 1e-5 degree and 1e-6 in each fraction.
    [Fact]
    public void PowerWeightedDirectionAndRoseMatchNumPy()
    {
        BinnedCellStatistics actual = new BinnedCellCalculator(reference.Options).Compute(reference.Data.Series());
        foreach (PeriodStatistics period in actual.Periods)
        {
            JsonNode e = Periods(reference.Expected)[period.Period.Name]!;
            Assert.Equal(e["dirCount"]!.GetValue<long>(), period.Direction.Count);
            Assert.Equal(0, Math.IEEERemainder(ReferenceAssert.Number(e["dirMean"]) - period.Direction.Mean, 360), 1e-5);
            Assert.Equal(ReferenceAssert.Number(e["dirSpread"]), period.Direction.Spread, 1e-5);
            Assert.Equal(16, period.Direction.PowerRose.Count);
            for (int k = 0; k < 16; k++)
                Assert.Equal(ReferenceAssert.Number(e["rose"]![k]), period.Direction.PowerRose[k], 1e-6);
        }
    }

    // Computation rule (tests/data/README.md): power per step, then averaged. Two alternating sea states (1 m, 6 s) and (3 m, 10 s)
    // in deep water: the mean power is 0.4906 (1 x 6 + 9 x 10) / 2 = 23.55 kW/m (IEC deep-water formula, from memory),
    // while the power of the mean Hs and Te would be 0.4906 x 2^2 x 8 = 15.70 kW/m.
    [Fact]
    public void MeanPowerIsNotPowerOfMeans()
    {
        const int n = 24 * 31;
        long start = new DateTimeOffset(2010, 1, 1, 0, 0, 0, TimeSpan.Zero).ToUnixTimeSeconds();
        long[] times = [.. Enumerable.Range(0, n).Select(k => start + 3600L * k)];
        float[] hs = [.. Enumerable.Range(0, n).Select(k => k % 2 == 0 ? 1f : 3f)];
        float[] te = [.. Enumerable.Range(0, n).Select(k => k % 2 == 0 ? 6f : 10f)];
        PeriodStatistics january = new BinnedCellCalculator().Compute(new CellSeries { Times = times, Hs = hs, Te = te, DepthMetres = double.NaN })
            .Find(AtlasPeriod.Month(1))!;
        double perStep = WavePower.DeepWaterCoefficient * (1 * 6 + 9 * 10) / 2.0;
        double ofMeans = WavePower.DeepWaterCoefficient * 2 * 2 * 8;
        Assert.Equal(23.55, january.J.Mean, 0.01);
        Assert.Equal(perStep, january.J.Mean, 1e-6 * perStep);
        Assert.True(Math.Abs(january.J.Mean - ofMeans) > 0.3 * ofMeans);
    }

    // Coverage is valid steps over the calendar's steps in the period: January complete, February
    // with every other step missing, March with nothing but NaN and negative heights. The default threshold 0.8 flags
    // February and March, not January.
    [Fact]
    public void CoverageCountsMissingStepsAndFlagsPeriodsBelowTheThreshold()
    {
        long start = new DateTimeOffset(2011, 1, 1, 0, 0, 0, TimeSpan.Zero).ToUnixTimeSeconds();
        long end = new DateTimeOffset(2011, 4, 1, 0, 0, 0, TimeSpan.Zero).ToUnixTimeSeconds();
        int n = (int)((end - start) / 3600);
        long[] times = [.. Enumerable.Range(0, n).Select(k => start + 3600L * k)];
        var hs = new float[n];
        var te = new float[n];
        for (int k = 0; k < n; k++)
        {
            DateTime t = DateTimeOffset.FromUnixTimeSeconds(times[k]).UtcDateTime;
            hs[k] = t.Month switch { 1 => 2f, 2 => k % 2 == 0 ? 2f : float.NaN, _ => k % 2 == 0 ? float.NaN : -0.5f };
            te[k] = 8f;
        }
        BinnedCellStatistics result = new BinnedCellCalculator().Compute(new CellSeries { Times = times, Hs = hs, Te = te, DepthMetres = 40 });
        PeriodStatistics jan = result.Find(AtlasPeriod.Month(1))!, feb = result.Find(AtlasPeriod.Month(2))!, mar = result.Find(AtlasPeriod.Month(3))!;
        Assert.Equal((744, 744L, 1.0), (jan.ExpectedSteps, jan.Hs.Count, jan.Hs.Coverage));
        Assert.Equal((672, 336L, 0.5), (feb.ExpectedSteps, feb.Hs.Count, feb.Hs.Coverage));
        Assert.Equal((744, 0L, 0.0), (mar.ExpectedSteps, mar.Hs.Count, mar.Hs.Coverage));
        Assert.Equal(336, feb.J.Count);
        Assert.False(jan.LowCoverage);
        Assert.True(feb.LowCoverage);
        Assert.True(mar.LowCoverage);
        PeriodStatistics annual = result.Find(AtlasPeriod.Annual)!;
        // Calendar-true: the annual period of a record of 2011 expects all 8,760 hours of 2011 (tests/data/README.md, coverage rule).
        Assert.Equal(8760, annual.ExpectedSteps);
        Assert.Equal((744 + 336) / 8760.0, annual.Hs.Coverage, 1e-15);
        Assert.True(annual.LowCoverage);
        Assert.Null(result.Find(AtlasPeriod.Month(4)));
        Assert.Null(result.Find(AtlasPeriod.Jja));
    }

    // MathNet's convention (tests/data/README.md): an expected numeric condition gives NaN with a count, here 0.
    [Fact]
    public void AllMissingInputGivesNaNWithCountZero()
    {
        var data = new InventedSeries(years: 1);
        float[] nothing = [.. data.Hs.Select(_ => float.NaN)];
        BinnedCellStatistics result = new BinnedCellCalculator().Compute(new CellSeries
        {
            Times = data.Times, Hs = nothing, Te = nothing, Tp = nothing, Dir = nothing, Spread = nothing, DepthMetres = double.NaN,
        });
        Assert.Equal(17 + 1, result.Periods.Count);
        foreach (PeriodStatistics p in result.Periods)
        {
            foreach (WaveParameter parameter in new[] { WaveParameter.Hs, WaveParameter.Te, WaveParameter.Tp, WaveParameter.J, WaveParameter.Spread, WaveParameter.D })
            {
                SummaryStatistics s = p.Summary(parameter);
                Assert.Equal(0, s.Count);
                Assert.Equal(0, s.Coverage);
                Assert.True(double.IsNaN(s.Mean) && double.IsNaN(s.Sd) && double.IsNaN(s.Min) && double.IsNaN(s.Max) && double.IsNaN(s.P50) && double.IsNaN(s.P99));
            }
            Assert.True(double.IsNaN(p.Direction.Mean));
            Assert.Empty(p.Direction.PowerRose);
            Assert.All(p.HsExceedance, e => Assert.True(double.IsNaN(e.Fraction)));
            Assert.True(p.LowCoverage);
        }
        // Te all NaN with Tp given: Te is derived from Tp (all NaN too); with neither, no Te and no power at all.
        Assert.Equal(EnergyPeriodSource.DerivedFromPeakPeriod, result.EnergyPeriodSource);
        BinnedCellStatistics bare = new BinnedCellCalculator().Compute(new CellSeries { Times = data.Times, Hs = data.Hs, DepthMetres = 30 });
        Assert.Equal(EnergyPeriodSource.Unavailable, bare.EnergyPeriodSource);
        Assert.All(bare.Periods, p => Assert.Equal(0, p.J.Count));
        Assert.All(bare.Periods, p => Assert.True(p.Hs.Count > 0));
    }

    [Fact]
    public void EmptyTimelineGivesNoPeriods()
    {
        BinnedCellStatistics result = new BinnedCellCalculator().Compute(new CellSeries { Times = [], Hs = [], DepthMetres = 10 });
        Assert.Empty(result.Periods);
    }

    // Te = 0.9 Tp when the dataset has no Te (IEC TS 62600-101, JONSWAP gamma 3.3, common practice), checked against
    // reference_statistics.py given no Te, and in deep water (depth unknown): power 0.4906 Hs^2 Te per step.
    [Fact]
    public void TeIsDerivedFromTpAndDeepWaterIsAssumedWhenTheyAreMissing()
    {
        var data = new InventedSeries(years: 2, seed: 11) { DepthMetres = double.NaN };
        JsonNode expected = data.Reference(reference.Options, withTe: false);
        BinnedCellStatistics actual = new BinnedCellCalculator().Compute(data.Series(withTe: false));
        Assert.Equal(EnergyPeriodSource.DerivedFromPeakPeriod, actual.EnergyPeriodSource);
        Assert.True(actual.DeepWaterAssumed);
        foreach (PeriodStatistics period in actual.Periods)
        {
            JsonNode e = Periods(expected)[period.Period.Name]!;
            ReferenceAssert.Summary(e["te"], period.Te, $"{period.Period} te", 1e-12, 0, 0.01 + 1e-9);
            ReferenceAssert.Summary(e["j"], period.J, $"{period.Period} j", 3e-7, 3e-7, 0.1 + 1e-4);
        }
    }

    // CDO's yseasmean convention (from memory), as the atlas defines its climatological seasons: DJF gathers every
    // December, January and February by calendar month; December 2001 is not moved to the winter of 2002. The season
    // is month-balanced: one step a month at the nominal (31-day) step, so January and December each have both
    // their steps, February one of its two, which then weighs twice: (1 + 4 + 2 x 2 + 3 + 6) / 6 = 3, where the pooled
    // mean would be 16 / 5 = 3.2.
    [Fact]
    public void SeasonsGatherCalendarMonthsAcrossYears()
    {
        long T(int y, int m) => new DateTimeOffset(y, m, 15, 0, 0, 0, TimeSpan.Zero).ToUnixTimeSeconds();
        long[] times = [T(2001, 1), T(2001, 2), T(2001, 12), T(2002, 1), T(2002, 6), T(2002, 12)];
        float[] hs = [1f, 2f, 3f, 4f, 5f, 6f];
        BinnedCellStatistics result = new BinnedCellCalculator().Compute(new CellSeries { Times = times, Hs = hs, DepthMetres = double.NaN });
        Assert.Equal((1 + 4 + 2 * 2 + 3 + 6) / 6.0, result.Find(AtlasPeriod.Djf)!.Hs.Mean, 1e-15);
        Assert.Equal(5.0, result.Find(AtlasPeriod.Jja)!.Hs.Mean);
        Assert.Equal((1 + 2 + 3) / 3.0, result.Find(AtlasPeriod.Year(2001))!.Hs.Mean, 1e-15);
        Assert.Equal((3 + 6) / 2.0, result.Find(AtlasPeriod.Month(12))!.Hs.Mean, 1e-15);
        Assert.Null(result.Find(AtlasPeriod.Mam));
    }

    [Fact]
    public void CalculatorReusedAcrossCellsGivesWhatAFreshOneGives()
    {
        var first = new InventedSeries(seed: 1);
        var second = new InventedSeries(seed: 2) { DepthMetres = 8 };
        var reused = new BinnedCellCalculator();
        reused.Compute(first.Series());
        reused.Compute(new InventedSeries(years: 1, seed: 3).Series()); // another timeline in between
        BinnedCellStatistics again = reused.Compute(second.Series());
        BinnedCellStatistics fresh = new BinnedCellCalculator().Compute(second.Series());
        Assert.Equal(fresh.Periods.Count, again.Periods.Count);
        for (int i = 0; i < fresh.Periods.Count; i++)
        {
            Assert.Equal(fresh.Periods[i].Hs, again.Periods[i].Hs);
            Assert.Equal(fresh.Periods[i].J, again.Periods[i].J);
            Assert.Equal(fresh.Periods[i].D, again.Periods[i].D);
            Assert.Equal(fresh.Periods[i].Direction.PowerRose, again.Periods[i].Direction.PowerRose);
            Assert.Equal(fresh.Periods[i].PowerExceedance, again.Periods[i].PowerExceedance);
        }
    }

    // The reused arrays the statistics pass reads, filled for cells of another shape in between (three years, then one
    // year with other thresholds' worth of fractions), hold what Compute gives as objects for the same cell.
    [Fact]
    public void ResultsComputedIntoReusedArraysEqualTheObjectsOfCompute()
    {
        var cell = new InventedSeries(seed: 4) { DepthMetres = 12 };
        var results = new BinnedCellResults();
        new BinnedCellCalculator(new StatisticsOptions { HsThresholdsMetres = [0.5, 1, 2, 3, 4, 5, 6, 7] }).Compute(new InventedSeries(years: 1, seed: 5).Series(), results);
        var calculator = new BinnedCellCalculator();
        calculator.Compute(new InventedSeries(years: 3, seed: 6).Series(), results);
        calculator.Compute(cell.Series(), results);
        BinnedCellStatistics expected = new BinnedCellCalculator().Compute(cell.Series());
        Assert.Equal(expected.Periods.Count, results.PeriodCount);
        Assert.Equal(expected.DepthMetres, results.DepthMetres);
        for (int i = 0; i < results.PeriodCount; i++)
        {
            PeriodStatistics e = expected.Periods[i];
            ref readonly PeriodResult p = ref results.Period(i);
            Assert.Equal(i, results.IndexOf(e.Period));
            Assert.Equal((e.Period, e.ExpectedSteps, e.Hs, e.Te, e.Tp, e.J, e.Spread, e.D, e.LowCoverage),
                (p.Period, p.ExpectedSteps, p.Hs, p.Te, p.Tp, p.J, p.Spread, p.D, p.LowCoverage));
            Assert.Equal((e.Direction.Mean, e.Direction.Spread, e.Direction.Count, e.Direction.Coverage, e.Direction.DirectionalityCoefficient, e.Direction.MaxPowerFromDeg),
                (p.Direction.Mean, p.Direction.Spread, p.Direction.Count, p.Direction.Coverage, p.DirectionalityCoefficient, p.MaxPowerFromDeg));
            Assert.Equal(e.Direction.PowerRose, results.PowerRose(i).ToArray());
            Assert.Equal(e.HsExceedance.Select(f => f.Fraction), results.HsExceedance(i).ToArray());
            Assert.Equal(e.PowerExceedance.Select(f => f.Fraction), results.PowerExceedance(i).ToArray());
            Assert.Equal(e.HsExceedance.Select(f => f.Threshold), results.HsThresholds.ToArray());
        }
        Assert.Equal(-1, results.IndexOf(AtlasPeriod.Year(1999)));
    }

    // A whole year without gaps: the month weights are equal, so the month-balanced annual period is the year itself.
    [Fact]
    public void SingleWholeYearGivesTheYearTheAnnualStatistics()
    {
        var data = new InventedSeries(years: 1);
        foreach (float[] values in new[] { data.Hs, data.Te, data.Dir })
            for (int k = 0; k < values.Length; k++)
                if (!(values[k] > 0)) values[k] = 2f;
        BinnedCellStatistics result = new BinnedCellCalculator().Compute(data.Series());
        Assert.Equal(result.Find(AtlasPeriod.Annual)! with { Period = AtlasPeriod.Year(2001) }, result.Find(AtlasPeriod.Year(2001))! with
        {
            HsExceedance = result.Find(AtlasPeriod.Annual)!.HsExceedance,
            PowerExceedance = result.Find(AtlasPeriod.Annual)!.PowerExceedance,
            Direction = result.Find(AtlasPeriod.Annual)!.Direction,
        });
    }

    [Fact]
    public void SeriesOfTheWrongLengthThrowsNamingTheField()
    {
        var data = new InventedSeries(years: 1);
        var error = Assert.Throws<ArgumentException>(() =>
            new BinnedCellCalculator().Compute(new CellSeries { Times = data.Times, Hs = data.Hs, Te = data.Te.AsSpan(1), DepthMetres = 10 }));
        Assert.Contains("CellSeries.Te", error.Message);
        var depth = Assert.Throws<ArgumentException>(() =>
            new BinnedCellCalculator().Compute(new CellSeries { Times = data.Times, Hs = data.Hs, DepthMetres = -3 }));
        Assert.Contains("DepthMetres", depth.Message);
    }

    [Fact]
    public void UnusableOptionsThrowNamingTheSetting()
    {
        var error = Assert.Throws<ArgumentException>(() => new BinnedCellCalculator(new StatisticsOptions { HsThresholdsMetres = [2, 1] }));
        Assert.Contains("HsThresholdsMetres", error.Message);
        var binning = Assert.Throws<ArgumentException>(() => new BinnedCellCalculator(new StatisticsOptions { PowerBinning = new HistogramBinning(0.3, 1000) }));
        Assert.Contains("PowerBinning", binning.Message);
    }
}
