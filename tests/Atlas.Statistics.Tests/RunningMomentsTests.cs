namespace Atlas.Statistics.Tests;

public class RunningMomentsTests
{
    // Values with a large offset (a classic trap for sum-of-squares variance): the shifted sums must give the exact
    // population variance of 1e9 + {4, 7, 13, 16}: mean 1e9 + 10, variance 22.5 (sample variance 30), by hand;
    // merging two halves accumulated about different shifts gives the same.
    [Fact]
    public void ShiftedSumsAvoidCancellationAndMergeExactly()
    {
        double[] values = [1e9 + 4, 1e9 + 7, 1e9 + 13, 1e9 + 16];
        var all = new RunningMoments();
        foreach (double v in values) all.Add(v);
        Assert.Equal(1e9 + 10, all.Mean, 1e-6);
        Assert.Equal(22.5, all.PopulationVariance, 1e-9);
        Assert.Equal(30, all.SampleVariance, 1e-9);

        var first = new RunningMoments();
        var second = new RunningMoments(1e9 + 20); // another shift near the mean: re-centred exactly on merging
        first.Add(values[0]);
        first.Add(values[1]);
        second.Add(values[2]);
        second.Add(values[3]);
        first.Merge(second);
        Assert.Equal(4, first.Count);
        Assert.Equal(22.5, first.PopulationVariance, 1e-6);
        Assert.Equal(1e9 + 4, first.Minimum);
        Assert.Equal(1e9 + 16, first.Maximum);
    }

    [Fact]
    public void EmptyAccumulatorGivesNaN()
    {
        var empty = new RunningMoments();
        Assert.Equal(0, empty.Count);
        Assert.True(double.IsNaN(empty.Mean));
        Assert.True(double.IsNaN(empty.PopulationVariance));
        Assert.True(double.IsNaN(empty.Minimum));
        var one = new RunningMoments();
        one.Add(3);
        Assert.True(double.IsNaN(one.SampleVariance));
        Assert.Equal(0, one.PopulationVariance);
    }
}
