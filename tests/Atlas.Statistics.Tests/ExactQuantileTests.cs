namespace Atlas.Statistics.Tests;

public class ExactQuantileTests
{
    private static readonly double[] Probabilities = [0, 0.01, 0.1, 0.25, 0.3, 0.5, 0.75, 0.9, 0.99, 1];

    // numpy.quantile with method= each of the nine Hyndman-Fan definitions (tests/data/statistics/quantiles.py);
    // samples of awkward sizes, with ties. The same arithmetic is used, so agreement to 1e-14 relative.
    [Fact]
    public void QuantilesEqualNumPyForEveryHyndmanFanDefinition()
    {
        int[] sizes = [1, 2, 5, 10, 101, 1000];
        using var python = new NumPyReference();
        var samples = new Dictionary<string, double[]>();
        foreach (int n in sizes)
        {
            var random = new Random(n);
            double[] values = [.. Enumerable.Range(0, n).Select(_ => Math.Round(random.NextDouble() * 40, 1))];
            samples[$"sample_{n:D4}"] = values;
            python.Write<double>($"sample_{n:D4}.f64", values);
        }
        var expected = python.Write<double>("probabilities.f64", Probabilities).Run("quantiles.py");
        foreach (var (name, values) in samples)
        {
            double[] sorted = [.. values.Order()];
            for (int type = 1; type <= 9; type++)
            {
                for (int q = 0; q < Probabilities.Length; q++)
                {
                    double reference = expected[name]![type.ToString()]![q]!.GetValue<double>();
                    double actual = ExactQuantile.OfSorted(sorted, Probabilities[q], (QuantileDefinition)type);
                    Assert.True(Math.Abs(reference - actual) <= 1e-14 * Math.Abs(reference),
                        $"type {type}, n {values.Length}, p {Probabilities[q]}: {actual:R}, NumPy {reference:R}");
                }
            }
        }
    }

    [Fact]
    public void DefaultIsTypeSevenLikeNumPy()
    {
        Assert.Equal(QuantileDefinition.HyndmanFanType7, ExactQuantile.Default);
        // numpy.percentile([1, 2, 3, 4], 90) = 3.7 (NumPy documentation's linear method: 1 + 0.9 x 3 = 3.7th of 1-based).
        Assert.Equal(3.7, ExactQuantile.Of([4, 1, double.NaN, 3, 2], 0.9), 1e-15);
    }

    [Fact]
    public void EmptyOrAllMissingSampleGivesNaN()
    {
        Assert.True(double.IsNaN(ExactQuantile.OfSorted([], 0.5)));
        Assert.True(double.IsNaN(ExactQuantile.Of([double.NaN, double.NaN], 0.5)));
        Assert.Throws<ArgumentOutOfRangeException>(() => ExactQuantile.OfSorted([1.0], 1.5));
    }
}
