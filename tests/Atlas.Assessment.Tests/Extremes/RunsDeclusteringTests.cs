using Atlas.Assessment.Extremes;

namespace Atlas.Assessment.Tests.Extremes;

// Clusters counted by hand on invented hourly series, with the runs rule of Coles (2001, §5.3.2):
// a cluster ends after at least r = separation / step consecutive steps at or below the threshold.
public class RunsDeclusteringTests
{
    private static RegularSeries Hourly(int count, params (int Index, double Value)[] set)
    {
        var values = Enumerable.Repeat(1.0, count).ToArray();
        foreach (var (index, value) in set)
            values[index] = value;
        return new RegularSeries(0, 3600, values);
    }

    [Fact]
    public void ExceedancesCloserThanTheSeparationShareOneStorm()
    {
        var series = Hourly(300, (10, 2.5), (11, 3.5), (12, 2.2), (60, 2.8), (109, 4.0), (120, 2.1), (200, 2.0), (250, 3.0));

        var peaks = RunsDeclustering.Decluster(series, threshold: 2.0, separationHours: 48);

        // 12 -> 60: 47 quiet hours, same storm. 60 -> 109: 48 quiet hours, a new storm. 109 -> 120: same.
        // 200 equals the threshold, which is not an exceedance. 120 -> 250: new storm.
        Assert.Equal(3, peaks.Count);
        Assert.Equal(new StormPeak(10 * 3600, 60 * 3600, 11 * 3600, 3.5, 4), peaks[0]);
        Assert.Equal(new StormPeak(109 * 3600, 120 * 3600, 109 * 3600, 4.0, 2), peaks[1]);
        Assert.Equal(new StormPeak(250 * 3600, 250 * 3600, 250 * 3600, 3.0, 1), peaks[2]);
    }

    [Fact]
    public void GapAsLongAsTheSeparationSplitsAStorm()
    {
        var values = Enumerable.Repeat(3.0, 300).ToArray();
        for (int i = 100; i < 148; i++)
            values[i] = double.NaN; // 48 missing hours inside a long storm

        var peaks = RunsDeclustering.Decluster(new RegularSeries(0, 3600, values), 2.0);

        Assert.Equal(2, peaks.Count);
        Assert.Equal(99 * 3600, peaks[0].EndUnixSeconds);
        Assert.Equal(148 * 3600, peaks[1].StartUnixSeconds);
    }

    [Fact]
    public void ZeroSeparationMakesEachUnbrokenRunAStorm()
    {
        var series = Hourly(20, (3, 2.5), (4, 2.6), (6, 2.7));

        Assert.Equal(2, RunsDeclustering.Decluster(series, 2.0, separationHours: 0).Count);
    }

    [Fact]
    public void SeparationIsCountedInHoursWhateverTheStep()
    {
        // 3-hourly steps: exceedances at steps 0 and 16 have 15 quiet steps = 45 h between them (< 48 h).
        var values = Enumerable.Repeat(1.0, 40).ToArray();
        values[0] = 3; values[16] = 3; values[33] = 3; // 16 -> 33: 16 quiet steps = 48 h, a new storm
        var peaks = RunsDeclustering.Decluster(new RegularSeries(0, 3 * 3600, values), 2.0, 48);

        Assert.Equal(2, peaks.Count);
    }
}
