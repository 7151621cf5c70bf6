using System.Text.Json;
using Atlas.Assessment.Validation;

namespace Atlas.Assessment.Tests.Validation;

/// <summary>Runs numpy.interp once for the class on irregular model times.</summary>
public sealed class TimeMatcherReference
{
    // Irregular model steps (1 h, 2 h, 3 h, 30 min ...) and observations between them.
    public long[] ModelTimes { get; } = [0, 3600, 10800, 21600, 23400, 27000, 30600];
    public double[] ModelValues { get; } = [1.0, 1.4, 0.9, 2.2, 2.5, 1.7, 1.1];
    public long[] ObservedTimes { get; } = [600, 3600, 5000, 9000, 15000, 17000, 22000, 25000, 28800];
    public double[] Interpolated { get; }

    public TimeMatcherReference()
    {
        var result = ReferencePython.Run("""
            import json, sys
            import numpy as np
            d = json.load(sys.stdin)
            print(json.dumps({"values": np.interp(d["obs"], d["t"], d["v"]).tolist()}))
            """, new { t = ModelTimes, v = ModelValues, obs = ObservedTimes });
        Interpolated = result.Doubles("values");
    }
}

public class TimeMatcherTests(TimeMatcherReference reference) : IClassFixture<TimeMatcherReference>
{
    [Fact]
    public void IrregularModelStepsAreInterpolatedLinearlyInTimeAsNumpyInterp()
    {
        // A tolerance wide enough for the 3 h steps, so every observation is matched.
        var matcher = new TimeMatcher(toleranceHours: 3);
        var observed = Enumerable.Repeat(1.0, reference.ObservedTimes.Length).ToArray();

        var pairs = matcher.Match(reference.ObservedTimes, observed, [], reference.ModelTimes, reference.ModelValues, isCircular: false);

        Assert.Equal(reference.ObservedTimes.Length, pairs.Counts.Matched);
        // Reference: numpy.interp (NumPy 1.24, Debian); tolerance 1e-12 (both are the same linear formula).
        for (int i = 0; i < pairs.Count; i++)
            Assert.Equal(reference.Interpolated[i], pairs.Modelled[i], 1e-12);
    }

    [Fact]
    public void ObservationFartherThanToleranceFromABracketingStepIsAModelGap()
    {
        // Default tolerance 1.5 h. Hourly model steps with a 4 h hole after 03:00, then 10:00 and 13:00.
        long h = 3600;
        long[] model = [0, h, 2 * h, 3 * h, 7 * h, 8 * h, 10 * h, 13 * h];
        double[] values = [1, 2, 3, 4, 5, 6, 7, 8];
        long[] obs = [h / 2, 9 * h / 4, 7 * h / 2, 5 * h, 6 * h, 15 * h / 2, 23 * h / 2, 41040];
        var pairs = new TimeMatcher().Match(obs, [1, 1, 1, 1, 1, 1, 1, 1], [], model, values, false);

        // Hand count: 00:30, 02:15 and 07:30 sit between hourly steps; 11:30 is exactly 1.5 h from 10:00 and
        // 13:00 (the bound is inclusive). 03:30, 05:00 and 06:00 have a neighbour 3.5, 2 and 3 h away, and
        // 11:24 (41040 s) is 1.6 h from 13:00: four model gaps.
        Assert.Equal(new MatchCounts(8, 4, 0, 0, 0, 4, 0), pairs.Counts);
        Assert.Equal([h / 2, 9 * h / 4, 15 * h / 2, 23 * h / 2], pairs.TimesUnixSeconds.ToArray());
        Assert.Equal([1.5, 3.25, 5.5, 7.5], pairs.Modelled.ToArray());
    }

    [Fact]
    public void WiderToleranceBridgesTheGap()
    {
        long h = 3600;
        var pairs = new TimeMatcher(toleranceHours: 9).Match([9 * h], [1.0], [], [6 * h, 15 * h], [3.0, 6.0], false);

        Assert.Equal(1, pairs.Counts.Matched);
        Assert.Equal(4.0, pairs.Modelled[0], 1e-12);
        Assert.Equal(1.5, TimeMatcher.DefaultToleranceHours);
    }

    [Fact]
    public void UnmatchedObservationsAreCountedByReason()
    {
        long h = 3600;
        long[] model = [0, h, 2 * h, 3 * h];
        double[] values = [1, double.NaN, 2, 2];
        long[] obs = [-h, h / 2, 2 * h + h / 2, 3 * h, 4 * h, 2 * h];
        double[] observed = [1, 1, 1, double.NaN, 1, 1];
        bool[] flagged = [false, false, false, false, false, true];

        var pairs = new TimeMatcher().Match(obs, observed, flagged, model, values, false);

        // -1 h and 4 h outside; 0.5 h brackets a NaN step; 3 h observation is NaN; 2 h flagged; 2.5 h matched.
        Assert.Equal(new MatchCounts(6, 1, 1, 1, 2, 0, 1), pairs.Counts);
        Assert.Equal(5, pairs.Counts.Unmatched);
    }

    [Fact]
    public void ObservationExactlyOnAStepUsesThatStepAlone()
    {
        long h = 3600;
        var pairs = new TimeMatcher().Match([h], [1.0], [], [0, h, 2 * h], [double.NaN, 7.0, double.NaN], false);

        Assert.Equal(7.0, Assert.Single(pairs.Modelled.ToArray()));
    }

    [Fact]
    public void DirectionIsInterpolatedAlongTheShorterArcAcrossNorth()
    {
        long h = 3600;
        // Hand-computed: 350 -> 10 degrees crosses north; a quarter of the way is 355, halfway is 0.
        var pairs = new TimeMatcher().Match([h / 4, h / 2], [0, 0], [], [0, h], [350, 10], isCircular: true);

        Assert.Equal(355.0, pairs.Modelled[0], 1e-9);
        Assert.Equal(0.0, pairs.Modelled[1], 1e-9);
        Assert.True(pairs.IsCircular);
    }

    [Fact]
    public void StationRecordFlagsAreHonoured()
    {
        using var reader = TestData.Open("station_good.csv");
        var record = StationRecordCsv.Parse(reader, "station_good.csv");
        long start = record.Observations[0].TimeUnixSeconds;
        long[] model = [.. Enumerable.Range(0, 6).Select(i => start + i * 3600L)];
        double[] hs = [1.0, 1.1, 1.2, 1.3, 1.4, 1.5];

        var pairs = new TimeMatcher().Match(record, WaveParameter.Hs, model, hs);
        var tp = new TimeMatcher().Match(record, WaveParameter.Tp, model, hs);

        Assert.Equal(new MatchCounts(5, 4, 1, 0, 0, 0, 0), pairs.Counts);
        Assert.Equal(1, tp.Counts.ObservedMissing); // the 02:00 row has no Tp
    }

    [Fact]
    public void ModelTimesThatDoNotIncreaseAreRejected()
    {
        Assert.Throws<ArgumentException>(() => new TimeMatcher().Match([0], [1.0], [], [0, 0], [1.0, 1.0], false));
    }
}
