namespace Atlas.Statistics.Tests;

public class FixedBinHistogramTests
{
    // The same data through the histogram and through the exact type-7 quantile (itself checked against NumPy in
    // ExactQuantileTests): agreement within one bin width below the upper bound, also for a sample split across
    // several histograms read as one. A few values beyond the upper bound land in the overflow bin: quantiles there
    // lie between the bound and the maximum, and the maximum itself is exact.
    [Theory]
    [InlineData(0.01, 30.0, 3)]
    [InlineData(0.1, 4000.0, 7)]
    [InlineData(0.5, 5.0, 11)]
    public void HistogramPercentilesAreWithinOneBinWidthOfExactOnes(double width, double upper, int seed)
    {
        var random = new Random(seed);
        double[] values = [.. Enumerable.Range(0, 5000).Select(_ => Math.Min(0.95 * upper, upper * 0.1 * -Math.Log(1 - random.NextDouble()))),
            1.5 * upper, 2 * upper, 3 * upper];
        var binning = new HistogramBinning(width, upper);
        var parts = new[] { new FixedBinHistogram(binning), new FixedBinHistogram(binning), new FixedBinHistogram(binning) };
        var whole = new FixedBinHistogram(binning);
        for (int i = 0; i < values.Length; i++)
        {
            parts[i % 3].Add(values[i]);
            whole.Add(values[i]);
        }
        double[] sorted = [.. values.Order()];
        double[] probabilities = [0, 0.01, 0.1, 0.5, 0.9, 0.99, 0.999, 0.9999, 1];
        var estimates = new double[probabilities.Length];
        FixedBinHistogram.EstimateQuantiles(parts, probabilities, estimates);
        for (int q = 0; q < probabilities.Length; q++)
        {
            double exact = ExactQuantile.OfSorted(sorted, probabilities[q]);
            if (exact < upper)
                Assert.True(Math.Abs(exact - estimates[q]) <= width, $"p {probabilities[q]}: estimate {estimates[q]}, exact {exact}");
            else
                Assert.InRange(estimates[q], upper, sorted[^1]);
            Assert.Equal(estimates[q], whole.EstimateQuantile(probabilities[q]), 1e-9);
        }
        Assert.Equal(sorted[^1], whole.EstimateQuantile(1), 1e-12);
        Assert.Equal(sorted[0], whole.EstimateQuantile(0), 1e-12);
    }

    [Fact]
    public void EmptyHistogramGivesNaNAndClearingEmptiesIt()
    {
        var histogram = new FixedBinHistogram(HistogramBinning.DefaultHs);
        Assert.True(double.IsNaN(histogram.EstimateQuantile(0.5)));
        histogram.Add(2.345);
        histogram.Add(17.5);
        Assert.Equal(2, histogram.Count);
        histogram.Clear();
        Assert.Equal(0, histogram.Count);
        Assert.True(double.IsNaN(histogram.EstimateQuantile(0.5)));
        histogram.Add(1.0);
        Assert.Equal(1.0, histogram.EstimateQuantile(0.5), 1e-12);
        Assert.Throws<ArgumentOutOfRangeException>(() => histogram.Add(-0.1));
        Assert.Throws<ArgumentOutOfRangeException>(() => histogram.Add(double.NaN));
    }
}
