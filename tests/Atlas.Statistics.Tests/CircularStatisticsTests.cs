namespace Atlas.Statistics.Tests;

public class CircularStatisticsTests
{
    // scipy.stats.circmean / circstd with high = 360 (tests/data/statistics/circular.py), on directions straddling
    // north where an arithmetic mean would be wrong; the weighted mean against numpy's arctan2 of the weighted sums.
    [Fact]
    public void MeansAndDeviationMatchSciPyAndNumPy()
    {
        var random = new Random(5);
        double[] directions = [.. Enumerable.Range(0, 500).Select(_ => (350 + 40 * (random.NextDouble() - 0.5) + 360) % 360)];
        double[] weights = [.. Enumerable.Range(0, 500).Select(_ => random.NextDouble() * 50)];
        using var python = new NumPyReference();
        var expected = python.Write<double>("directions.f64", directions).Write<double>("weights.f64", weights).Run("circular.py");

        Assert.Equal(expected["circmean"]!.GetValue<double>(), CircularStatistics.Mean(directions), 1e-9);
        Assert.Equal(expected["circstd"]!.GetValue<double>(), CircularStatistics.StandardDeviation(directions), 1e-9);
        Assert.Equal(expected["weightedMean"]!.GetValue<double>(), CircularStatistics.WeightedMean(directions, weights), 1e-9);
        Assert.Equal(expected["weightedR"]!.GetValue<double>(), CircularStatistics.MeanResultantLength(directions, weights), 1e-12);
        Assert.InRange(CircularStatistics.Mean(directions), 0, 360);
    }

    // Analytic cases: spread sqrt(2 (1 - R)) is 0 for one direction and sqrt(2) rad (81.03 degrees) for directions
    // that cancel; opposite equal weights leave no mean direction (NaN); missing pairs are skipped.
    [Fact]
    public void SpreadAndDegenerateCasesFollowTheDefinitions()
    {
        Assert.Equal(0, CircularStatistics.Spread([42, 42, 42]), 1e-6);
        Assert.Equal(Math.Sqrt(2) * 180 / Math.PI, CircularStatistics.Spread([0, 90, 180, 270]), 1e-6);
        Assert.True(double.IsNaN(CircularStatistics.MeanFromSums(0, 0)));
        Assert.Equal(10, CircularStatistics.WeightedMean([10, double.NaN, 200], [1, 5, double.NaN]), 1e-12);
        Assert.True(double.IsNaN(CircularStatistics.Mean([])));
    }

    [Theory]
    [InlineData(0.0, 0)]
    [InlineData(11.2, 0)]
    [InlineData(11.25, 1)]
    [InlineData(348.75, 0)]
    [InlineData(348.7, 15)]
    [InlineData(-10.0, 0)]
    [InlineData(90.0, 4)]
    [InlineData(725.0, 0)]
    public void SixteenSectorsAreCentredOnNorth(double direction, int sector)
    {
        Assert.Equal(sector, CircularStatistics.Sector(direction, 16));
    }
}
