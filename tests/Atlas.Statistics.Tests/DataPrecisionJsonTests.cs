using System.Text.Json;

namespace Atlas.Statistics.Tests;

/// <summary>Statistics of float data are written to seven significant digits, missing values as null.</summary>
public class DataPrecisionJsonTests
{
    [Fact]
    public void SummariesAreWrittenToSevenSignificantDigitsAndMissingValuesAsNull()
    {
        var summary = new SummaryStatistics(3.7811184595989924, double.NaN, (double)1.023f, 11.838000297546387, 1.8119000911712646,
            123456.789, 1e-9 / 3, double.PositiveInfinity, 744, 1);
        var json = JsonSerializer.Serialize(summary);
        Assert.Contains("\"Mean\":3.781118,", json);
        Assert.Contains("\"Sd\":null,", json);
        Assert.Contains("\"Min\":1.023,", json);
        Assert.Contains("\"Max\":11.838,", json);
        Assert.Contains("\"P10\":1.8119,", json);
        Assert.Contains("\"P50\":123456.8,", json);
        Assert.Contains("\"P90\":3.333333E-10,", json);
        Assert.Contains("\"P99\":null,", json);
        var back = JsonSerializer.Deserialize<SummaryStatistics>(json);
        Assert.True(double.IsNaN(back.Sd));
        Assert.Equal(3.781118, back.Mean);
    }

    [Fact]
    public void ExceedanceThresholdsReadAsTheirDecimalSteps()
    {
        var hours = 2000;
        CellSeries series = new()
        {
            Times = [.. Enumerable.Range(0, hours).Select(h => 1_609_459_200L + 3600L * h)],
            Hs = [.. Enumerable.Range(0, hours).Select(h => 0.5f + (h % 37) * 0.1f)],
            Te = [.. Enumerable.Range(0, hours).Select(_ => 8f)],
            DepthMetres = double.NaN,
        };
        var curve = ExactPointAnalysis.Analyse(series).HsExceedance;
        Assert.Equal(0.3, curve.Thresholds[3]);
        Assert.Equal(0.7, curve.Thresholds[7]);
        var json = JsonSerializer.Serialize(curve);
        Assert.Contains("0.3,0.4,0.5,0.6,0.7,0.8", json);
        Assert.DoesNotContain("0000000", json);
    }
}
