using System.Text.Json;
using System.Text.Json.Nodes;

namespace Atlas.Statistics.Tests;

[Collection(InventedSeriesCollection.Name)]
public class ExactPointAnalysisTests(InventedSeriesReference reference)
{
    private static JsonObject Periods(JsonNode expected) => expected["periods"]!.AsObject();

    // numpy.percentile (default 'linear' = Hyndman-Fan type 7) and float64 means per period (reference_statistics.py):
    // exact percentiles agree to rounding (1e-12 relative; power 3e-7, stored in single precision per step).
    [Fact]
    public void PeriodStatisticsWithExactPercentilesMatchNumPy()
    {
        ExactPointStatistics result = ExactPointAnalysis.Analyse(reference.Data.Series());
        Assert.Equal(20, result.Periods.Count);
        foreach (PeriodStatistics period in result.Periods)
        {
            JsonNode e = Periods(reference.Expected)[period.Period.Name]!;
            string name = period.Period.Name;
            ReferenceAssert.Summary(e["hs"], period.Hs, $"{name} hs", 1e-12, 0, 1e-12 * 20);
            ReferenceAssert.Summary(e["te"], period.Te, $"{name} te", 1e-12, 0, 1e-12 * 20);
            ReferenceAssert.Summary(e["tp"], period.Tp, $"{name} tp", 1e-12, 0, 1e-12 * 20);
            ReferenceAssert.Summary(e["spread"], period.Spread, $"{name} spread", 1e-12, 0, 1e-12 * 50);
            ReferenceAssert.Summary(e["j"], period.J, $"{name} j", 3e-7, 3e-7, 3e-7 * 200);
            for (int t = 0; t < period.HsExceedance.Count; t++)
                Assert.Equal(ReferenceAssert.Number(e["hsExceedance"]![t]), period.HsExceedance[t].Fraction, 1e-12);
        }
    }

    // The chosen definition reaches the percentiles: type 8 against numpy's 'median_unbiased', with a window of two
    // years and the summer months, where annual means the whole window (reference_statistics.py applies the same window).
    [Fact]
    public void WindowAndQuantileDefinitionAreApplied()
    {
        var window = new AnalysisWindow(2002, 2003, [6, 7, 8]);
        JsonNode expected = reference.Data.Reference(reference.Options, method: "median_unbiased", window: window);
        ExactPointStatistics result = ExactPointAnalysis.Analyse(reference.Data.Series(),
            new ExactPointOptions { QuantileDefinition = QuantileDefinition.HyndmanFanType8, Window = window });
        Assert.Equal("jun jul aug jja annual y2002 y2003", string.Join(' ', result.Periods.Select(p => p.Period.Name)));
        Assert.Equal(2 * (30 + 31 + 31) * 8, result.StepsInWindow);
        foreach (PeriodStatistics period in result.Periods)
        {
            JsonNode e = Periods(expected)[period.Period.Name]!;
            Assert.Equal(e["expected"]!.GetValue<long>(), period.ExpectedSteps);
            ReferenceAssert.Summary(e["hs"], period.Hs, $"{period.Period} hs", 1e-12, 0, 1e-12 * 20);
            ReferenceAssert.Summary(e["j"], period.J, $"{period.Period} j", 3e-7, 3e-7, 3e-7 * 200);
        }
        Assert.Equal(result.Find(AtlasPeriod.Jja)!.Hs, result.Find(AtlasPeriod.Annual)!.Hs);
    }

    // Seven years of hourly steps (61,368) take the path that radix-sorts the parameters on every core: the same
    // NumPy reference (numpy.percentile 'linear', float64 means) to the same tolerances.
    [Fact]
    public void DecadesOfHourlyStepsMatchNumPyOnTheParallelPath()
    {
        var data = new InventedSeries(firstYear: 2010, years: 7, stepHours: 1, seed: 11);
        JsonNode expected = data.Reference(reference.Options);
        ExactPointStatistics result = ExactPointAnalysis.Analyse(data.Series());
        Assert.Equal(61_368, result.StepsInWindow);
        foreach (PeriodStatistics period in result.Periods)
        {
            JsonNode e = Periods(expected)[period.Period.Name]!;
            string name = period.Period.Name;
            ReferenceAssert.Summary(e["hs"], period.Hs, $"{name} hs", 1e-12, 0, 1e-12 * 20);
            ReferenceAssert.Summary(e["tp"], period.Tp, $"{name} tp", 1e-12, 0, 1e-12 * 20);
            ReferenceAssert.Summary(e["spread"], period.Spread, $"{name} spread", 1e-12, 0, 1e-12 * 50);
            ReferenceAssert.Summary(e["j"], period.J, $"{name} j", 3e-7, 3e-7, 3e-7 * 200);
        }
    }

    // The parallel path (sorts, joint table and direction sums on every core) is a schedule, not a method: it must
    // give the very same numbers, bit for bit, as the calling thread alone, with Te given or derived from Tp, and
    // with or without a window.
    [Fact]
    public void ParallelPathGivesTheSameResultsAsTheSequentialOne()
    {
        var data = new InventedSeries(firstYear: 2010, years: 7, stepHours: 1, seed: 11);
        var json = new JsonSerializerOptions { NumberHandling = System.Text.Json.Serialization.JsonNumberHandling.AllowNamedFloatingPointLiterals };
        foreach (bool withTe in new[] { true, false })
            foreach (AnalysisWindow? window in new[] { null, new AnalysisWindow(2011, 2015, [12, 1, 2]) })
            {
                var options = new ExactPointOptions { Window = window };
                string sequential = JsonSerializer.Serialize(ExactPointAnalysis.Analyse(data.Series(withTe), options, null, parallel: false), json);
                string parallel = JsonSerializer.Serialize(ExactPointAnalysis.Analyse(data.Series(withTe), options, null, parallel: true), json);
                Assert.Equal(sequential, parallel);
                Assert.Contains("\"Counts\":[[", parallel);
            }
    }

    // Parts left out are not computed, and what is computed does not change: J's period summaries and exceedance
    // fractions alone (ExactParts.None), or everything but the curves, joint table and yearly means, give the very same
    // numbers as the whole analysis, with and without a window (compared to the bit through their JSON).
    [Fact]
    public void PartsLeftOutLeaveTheComputedOnesUnchanged()
    {
        var data = new InventedSeries(firstYear: 2010, years: 3, stepHours: 1, seed: 5);
        var json = new JsonSerializerOptions { NumberHandling = System.Text.Json.Serialization.JsonNumberHandling.AllowNamedFloatingPointLiterals };
        foreach (AnalysisWindow? window in new[] { null, new AnalysisWindow(2011, 2012, [12, 1, 2, 7]) })
        {
            ExactPointStatistics all = ExactPointAnalysis.Analyse(data.Series(), new ExactPointOptions { Window = window });
            ExactPointStatistics summaries = ExactPointAnalysis.Analyse(data.Series(),
                new ExactPointOptions { Window = window, Parts = ExactParts.OtherSummaries | ExactParts.Directions });
            Assert.Equal(JsonSerializer.Serialize(all.Periods, json), JsonSerializer.Serialize(summaries.Periods, json));
            Assert.Empty(summaries.HsExceedance.Thresholds);
            Assert.Equal(0, summaries.JointOccurrence.TotalCount);
            Assert.Empty(summaries.InterAnnual);

            ExactPointStatistics power = ExactPointAnalysis.Analyse(data.Series(), new ExactPointOptions { Window = window, Parts = ExactParts.None });
            Assert.Equal(all.Periods.Select(p => p.Period), power.Periods.Select(p => p.Period));
            for (int i = 0; i < all.Periods.Count; i++)
            {
                Assert.Equal(JsonSerializer.Serialize(all.Periods[i].J, json), JsonSerializer.Serialize(power.Periods[i].J, json));
                Assert.Equal(JsonSerializer.Serialize(all.Periods[i].PowerExceedance, json), JsonSerializer.Serialize(power.Periods[i].PowerExceedance, json));
                Assert.Equal(all.Periods[i].LowCoverage, power.Periods[i].LowCoverage);
                Assert.Equal(0, power.Periods[i].Hs.Count);
                Assert.Equal(0, power.Periods[i].Direction.Count);
            }
        }
    }

    // A curve kept to at most N thresholds reads the same exact fractions at its coarser thresholds as the 1 kW/m curve
    // at the same values: the step is the smallest 1, 2, 5 x 10^k kW/m that needs no more than N thresholds up to the
    // largest J (common practice for chart axes), and a step that already needs no more is kept.
    [Fact]
    public void CoarseningThePowerCurveKeepsItsFractionsExact()
    {
        var data = new InventedSeries(firstYear: 2010, years: 2, stepHours: 1, seed: 3);
        ExactPointStatistics fine = ExactPointAnalysis.Analyse(data.Series());
        double largest = fine.PowerExceedance.Thresholds[^1];
        foreach (int most in new[] { 2, 5, 12, 40, 100, 10_000 })
        {
            ExactPointStatistics coarse = ExactPointAnalysis.Analyse(data.Series(), new ExactPointOptions { PowerCurveMaxThresholds = most });
            ExceedanceCurve curve = coarse.PowerExceedance;
            Assert.True(curve.Thresholds.Count <= most, $"{curve.Thresholds.Count} thresholds for at most {most}");
            double expected = new[] { 1.0, 2, 5, 10, 20, 50, 100, 200, 500, 1000 }.First(step => Math.Ceiling(largest / step) + 1 <= most || step >= 1000);
            Assert.Equal(expected, curve.Step);
            Assert.Equal(fine.PowerExceedance.Count, curve.Count);
            for (int k = 0; k < curve.Thresholds.Count; k++)
            {
                int atFine = (int)Math.Round(curve.Thresholds[k]);
                if (atFine < fine.PowerExceedance.Thresholds.Count) Assert.Equal(fine.PowerExceedance.Fractions[atFine], curve.Fractions[k]);
                else Assert.Equal(0, curve.Fractions[k]);
            }
        }
        Assert.Throws<ArgumentException>(() => ExactPointAnalysis.Analyse(data.Series(), new ExactPointOptions { PowerCurveMaxThresholds = 1 }));
    }

    // A calendar kept from an earlier analysis is used only for the timeline it was built for: with another
    // timeline the analysis builds the right one and gives what it gives without a kept calendar.
    [Fact]
    public void KeptCalendarServesOnlyItsOwnTimeline()
    {
        var data = new InventedSeries(years: 2);
        var other = new InventedSeries(firstYear: 2005, years: 1);
        var json = new JsonSerializerOptions { NumberHandling = System.Text.Json.Serialization.JsonNumberHandling.AllowNamedFloatingPointLiterals };
        var kept = new TimelineCalendar(data.Times);
        Assert.Equal(JsonSerializer.Serialize(ExactPointAnalysis.Analyse(data.Series()), json),
                     JsonSerializer.Serialize(ExactPointAnalysis.Analyse(data.Series(), calendar: kept), json));
        ExactPointStatistics elsewhere = ExactPointAnalysis.Analyse(other.Series(), calendar: kept);
        Assert.Equal(JsonSerializer.Serialize(ExactPointAnalysis.Analyse(other.Series()), json), JsonSerializer.Serialize(elsewhere, json));
        Assert.Equal("y2005", elsewhere.Periods[^1].Period.Name);
    }

    // Exceedance curves at 0, 0.1, 0.2 ... m and 0, 1, 2 ... kW/m (numpy mean of v > t in float32, month-balanced:
    // the weight above over the total, to rounding 1e-12), the joint Hs-Te table against numpy.histogram2d on
    // 0.5 m x 1 s bins (occurrence and energy weighted by the month weights), and yearly and seasonal means with the
    // coefficient of variation (ddof = 1) of the years with enough coverage, winters contiguous (December of the year
    // before), labelled by the interval of their months.
    [Fact]
    public void CurvesJointTableAndInterAnnualVariabilityMatchNumPy()
    {
        ExactPointStatistics result = ExactPointAnalysis.Analyse(reference.Data.Series());
        JsonNode e = reference.Expected;

        Assert.Equal(e["hsCurve"]!["thresholds"]!.AsArray().Count, result.HsExceedance.Thresholds.Count);
        for (int k = 0; k < result.HsExceedance.Thresholds.Count; k++)
        {
            Assert.Equal(ReferenceAssert.Number(e["hsCurve"]!["thresholds"]![k]), result.HsExceedance.Thresholds[k], 1e-12);
            Assert.Equal(ReferenceAssert.Number(e["hsCurve"]!["fractions"]![k]), result.HsExceedance.Fractions[k], 1e-12);
        }
        Assert.Equal(0, result.HsExceedance.Fractions[^1]);
        Assert.Equal(e["jCurve"]!["thresholds"]!.AsArray().Count, result.PowerExceedance.Thresholds.Count);
        for (int k = 0; k < result.PowerExceedance.Thresholds.Count; k++)
            Assert.Equal(ReferenceAssert.Number(e["jCurve"]!["fractions"]![k]), result.PowerExceedance.Fractions[k], 2.0 / result.PowerExceedance.Count);

        JointOccurrenceTable joint = result.JointOccurrence;
        JsonNode ej = e["joint"]!;
        Assert.Equal(ej["total"]!.GetValue<long>(), joint.TotalCount);
        Assert.Equal(ej["hsEdges"]!.AsArray().Select(x => x!.GetValue<double>()), joint.HsBinLowerEdges);
        Assert.Equal(ej["teEdges"]!.AsArray().Select(x => x!.GetValue<double>()), joint.TeBinLowerEdges);
        double fractionOfTime = 0, fractionOfEnergy = 0;
        for (int r = 0; r < joint.Counts.Length; r++)
            for (int c = 0; c < joint.Counts[r].Length; c++)
            {
                Assert.Equal(ej["counts"]![r]![c]!.GetValue<long>(), joint.Counts[r][c]);
                Assert.Equal(ReferenceAssert.Number(ej["fractionOfEnergy"]![r]![c]), joint.FractionOfEnergy[r][c], 1e-6);
                Assert.Equal(ReferenceAssert.Number(ej["fractionOfTime"]![r]![c]), joint.FractionOfTime[r][c], 1e-12);
                Assert.Equal(joint.Counts[r][c] == 0, joint.MeanPowerKilowattsPerMetre[r][c] is null);
                fractionOfTime += joint.FractionOfTime[r][c];
                fractionOfEnergy += joint.FractionOfEnergy[r][c];
            }
        Assert.Equal(1, fractionOfTime, 1e-12);
        Assert.Equal(1, fractionOfEnergy, 1e-12);

        Assert.Equal("annual djf mam jja son", string.Join(' ', result.InterAnnual.Select(s => s.Period.Name)));
        foreach (InterAnnualSeries series in result.InterAnnual)
        {
            JsonNode es = e["interAnnual"]![series.Period.Name]!;
            Assert.Equal(es["years"]!.AsArray().Count, series.Years.Count);
            for (int y = 0; y < series.Years.Count; y++)
            {
                JsonNode ey = es["years"]![y]!;
                Assert.Equal(ey["year"]!.GetValue<int>(), series.Years[y].Year);
                Assert.Equal(ey["label"]!.GetValue<string>(), series.Years[y].Label);
                ReferenceAssert.Close(ReferenceAssert.Number(ey["hs"]), series.Years[y].Hs, 1e-12, $"{series.Period} {series.Years[y].Year} hs");
                ReferenceAssert.Close(ReferenceAssert.Number(ey["te"]), series.Years[y].Te, 1e-12, $"{series.Period} {series.Years[y].Year} te");
                ReferenceAssert.Close(ReferenceAssert.Number(ey["j"]), series.Years[y].J, 3e-7, $"{series.Period} {series.Years[y].Year} j");
                Assert.Equal(ReferenceAssert.Number(ey["coverage"]), series.Years[y].Coverage, 1e-15);
            }
            Assert.Equal(es["leftOut"]!.AsArray().Select(x => x!.GetValue<int>()), series.YearsLeftOut);
            ReferenceAssert.Close(ReferenceAssert.Number(es["hsCov"]), series.HsCoefficientOfVariation, 1e-9, $"{series.Period} hs cv");
            ReferenceAssert.Close(ReferenceAssert.Number(es["teCov"]), series.TeCoefficientOfVariation, 1e-9, $"{series.Period} te cv");
            ReferenceAssert.Close(ReferenceAssert.Number(es["jCov"]), series.JCoefficientOfVariation, 1e-5, $"{series.Period} j cv");
        }
    }

    // Every implementation of the same quantity against the same reference (tests/data/README.md): the layer pass and the point
    // analysis agree on counts, means and exceedance exactly or to rounding, and on percentiles within a bin width.
    [Fact]
    public void PointAnalysisAndLayerPassAgree()
    {
        BinnedCellStatistics layer = new BinnedCellCalculator().Compute(reference.Data.Series());
        ExactPointStatistics point = ExactPointAnalysis.Analyse(reference.Data.Series());
        Assert.Equal(layer.Periods.Select(p => p.Period), point.Periods.Select(p => p.Period));
        for (int i = 0; i < layer.Periods.Count; i++)
        {
            PeriodStatistics a = layer.Periods[i], b = point.Periods[i];
            Assert.Equal(a.ExpectedSteps, b.ExpectedSteps);
            Assert.Equal(a.LowCoverage, b.LowCoverage);
            // The period directionality coefficient: the same harmonic sums, merged in another order.
            Assert.Equal(a.D.Count, b.D.Count);
            ReferenceAssert.Close(b.D.Mean, a.D.Mean, 1e-12, $"{a.Period} d");
            Assert.Equal(0, Math.IEEERemainder(a.Direction.MaxPowerFromDeg - b.Direction.MaxPowerFromDeg, 360), 1e-6);
            foreach (var (parameter, width) in new[] { (WaveParameter.Hs, 0.01), (WaveParameter.Te, 0.01), (WaveParameter.J, 0.1) })
            {
                SummaryStatistics x = a.Summary(parameter), y = b.Summary(parameter);
                Assert.Equal(x.Count, y.Count);
                ReferenceAssert.Close(y.Mean, x.Mean, 1e-12, $"{a.Period} {parameter} mean");
                Assert.Equal(y.Max, x.Max);
                Assert.True(Math.Abs(x.P90 - y.P90) <= width + 1e-9, $"{a.Period} {parameter} p90 {x.P90} vs {y.P90}");
            }
            // Month-balanced fractions are sums of weights, taken in another order: equal to rounding.
            for (int t = 0; t < a.HsExceedance.Count; t++) Assert.Equal(a.HsExceedance[t].Fraction, b.HsExceedance[t].Fraction, 1e-12);
            for (int t = 0; t < a.PowerExceedance.Count; t++) Assert.Equal(a.PowerExceedance[t].Fraction, b.PowerExceedance[t].Fraction, 1e-12);
            Assert.Equal(a.Direction.Count, b.Direction.Count);
        }
    }

    // The results go out as JSON (RFC 8259 has no NaN): missing values become null, periods their names.
    [Fact]
    public void ResultsSerialiseToJsonWithoutNaN()
    {
        var data = new InventedSeries(years: 1);
        float[] nothing = [.. data.Hs.Select(_ => float.NaN)];
        var empty = new CellSeries { Times = data.Times, Hs = nothing, Te = nothing, DepthMetres = double.NaN };
        foreach (string json in new[]
                 {
                     JsonSerializer.Serialize(ExactPointAnalysis.Analyse(data.Series())),
                     JsonSerializer.Serialize(ExactPointAnalysis.Analyse(empty)),
                     JsonSerializer.Serialize(new BinnedCellCalculator().Compute(empty)),
                 })
        {
            Assert.DoesNotContain("NaN", json);
            Assert.DoesNotContain("Infinity", json);
            JsonNode parsed = JsonNode.Parse(json)!;
            Assert.Equal("jan", parsed["Periods"]![0]!["Period"]!.GetValue<string>());
        }
        string emptyJson = JsonSerializer.Serialize(ExactPointAnalysis.Analyse(empty));
        Assert.Contains("\"Mean\":null", emptyJson);
        Assert.Contains("\"DepthMetres\":null", emptyJson);
        Assert.Contains("\"QuantileDefinition\":\"HyndmanFanType7\"", emptyJson);

        ExactPointStatistics? back = JsonSerializer.Deserialize<ExactPointStatistics>(JsonSerializer.Serialize(ExactPointAnalysis.Analyse(empty)));
        Assert.NotNull(back);
        Assert.True(double.IsNaN(back.Periods[0].Hs.Mean));
        Assert.Equal(AtlasPeriod.Month(1), back.Periods[0].Period);
    }

    // A window beside the record (years the series does not reach) leaves nothing to analyse: no period, empty
    // curves and joint table, no inter-annual rows; on both paths.
    [Fact]
    public void WindowOutsideTheRecordGivesNoPeriods()
    {
        var data = new InventedSeries(firstYear: 2010, years: 7, stepHours: 1, seed: 11);
        foreach (bool parallel in new[] { false, true })
        {
            ExactPointStatistics result = ExactPointAnalysis.Analyse(data.Series(), new ExactPointOptions { Window = new AnalysisWindow(1990, 1999) }, null, parallel);
            Assert.Empty(result.Periods);
            Assert.Equal(0, result.StepsInWindow);
            Assert.Empty(result.HsExceedance.Thresholds);
            Assert.Equal(0, result.JointOccurrence.TotalCount);
            Assert.Empty(result.InterAnnual);
        }
    }

    [Fact]
    public void UnusableWindowThrowsSayingWhy()
    {
        var error = Assert.Throws<ArgumentException>(() =>
            ExactPointAnalysis.Analyse(reference.Data.Series(), new ExactPointOptions { Window = new AnalysisWindow(2003, 2001) }));
        Assert.Contains("first year 2003 is after its last year 2001", error.Message);
        Assert.Throws<ArgumentException>(() =>
            ExactPointAnalysis.Analyse(reference.Data.Series(), new ExactPointOptions { Window = new AnalysisWindow(Months: [13]) }));
    }
}
