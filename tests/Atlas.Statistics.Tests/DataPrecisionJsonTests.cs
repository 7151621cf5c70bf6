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

    // The converter writes the seven digits it formats without reading them back; the text is the one the JSON writer
    // gives the rounded value (its shortest round-trip form), over values from 1e-12 to 1e12, negative, zero and -0.
    [Fact]
    public void WrittenDigitsAreThoseOfTheRoundedValue()
    {
        var random = new Random(7);
        var values = new List<double> { 0, -0.0, 1, -1, 0.1, 1e-5, 9.9999995e-5, 1234567, 12345675, 9999999.5, 1e7, 1e15, 1e16, float.MaxValue, float.Epsilon };
        for (int k = 0; k < 20_000; k++) values.Add((random.NextDouble() - 0.3) * Math.Pow(10, random.Next(-12, 13)));
        var converter = new DataPrecisionJsonConverter();
        foreach (double v in values)
        {
            using var written = new MemoryStream();
            using (var writer = new Utf8JsonWriter(written)) converter.Write(writer, v, JsonSerializerOptions.Default);
            using var expected = new MemoryStream();
            using (var writer = new Utf8JsonWriter(expected)) writer.WriteNumberValue(DataPrecisionJsonConverter.Round(v));
            Assert.Equal(System.Text.Encoding.UTF8.GetString(expected.ToArray()), System.Text.Encoding.UTF8.GetString(written.ToArray()));
        }
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
