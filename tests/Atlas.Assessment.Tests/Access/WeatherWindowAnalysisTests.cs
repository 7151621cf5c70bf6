using Atlas.Assessment.Access;

namespace Atlas.Assessment.Tests.Access;

// Every expected value here is counted by hand on invented series whose windows are known by
// construction; the definitions are those documented on WeatherWindowAnalysis and MonthlyWindowStatistics.
public class WeatherWindowAnalysisTests
{
    private const long Hour = 3600;
    private static readonly long January2021 = UnixSeconds.Of(new DateTime(2021, 1, 1, 0, 0, 0, DateTimeKind.Utc));
    private static readonly AccessLimits HsBelowOneAndAHalf = new(1.5);

    /// <summary>Hourly January 2021 (744 h): every day calm (1.0 m) for hours 0-9, then 2.5 m for hours 10-23.</summary>
    private static double[] TenCalmHoursADay(int days = 31) =>
        [.. Enumerable.Range(0, days * 24).Select(i => i % 24 < 10 ? 1.0 : 2.5)];

    [Fact]
    public void DailyTenHourCalmGivesFiveStartsADayForASixHourWindow()
    {
        var result = WeatherWindowAnalysis.Analyse(new RegularSeries(January2021, Hour, TenCalmHoursADay()), null, HsBelowOneAndAHalf, 6);
        var january = result.Months[0];

        Assert.Equal(6, result.RequiredSteps);
        Assert.Equal(744, january.Steps);
        // A 10 h spell holds a 6 h window starting at hours 0..4: 5 starts a day, 31 days; all 744 steps determined.
        Assert.Equal(744, january.DeterminedSteps);
        Assert.Equal(155, january.WindowStartSteps);
        Assert.Equal(155.0 / 744.0, january.WindowStartProbability, 1e-15);
        // One distinct window a day; the whole month is covered, so 31 windows per month.
        Assert.Equal(31, january.WindowCount);
        Assert.Equal(1.0, january.EquivalentMonths, 1e-12);
        Assert.Equal(31.0, january.MeanWindowsPerMonth, 1e-12);
        // Waiting: 0 h at hours 0..4; at hours 5..23, 24 - h hours until the next day's hour 0 (1 + ... + 19 = 190 h a day).
        // The last day's hours 5..23 have no later window in the record and are left out: 30 x 24 + 5 = 725 samples.
        Assert.Equal(725, january.WaitingSamples);
        Assert.Equal(30 * 190.0 / 725, january.MeanWaitingHours, 1e-12);
        Assert.Equal(new AccessibilityFraction(310, 744), january.Accessibility);
        Assert.Equal(310.0 / 744, result.Accessibility.Fraction, 1e-15);
        Assert.True(double.IsNaN(result.Months[1].WindowStartProbability)); // no February in the record
    }

    [Fact]
    public void CalmAndStormSpellsAreCountedWithTheirDurations()
    {
        var result = WeatherWindowAnalysis.Analyse(new RegularSeries(January2021, Hour, TenCalmHoursADay()), null, HsBelowOneAndAHalf, 6);

        Assert.Equal(31, result.CalmSpells.Count);
        Assert.Equal(10.0, result.CalmSpells.MeanHours);
        Assert.Equal(10.0, result.CalmSpells.MedianHours);
        Assert.Equal(10.0, result.CalmSpells.MaximumHours);
        Assert.Equal(1, result.CalmSpells.CensoredCount);  // the first starts at the record start
        Assert.Equal(31, result.CalmSpells.Classes.Single(c => c.LowerHours == 6).Count); // [6, 12) h
        Assert.Equal(31, result.StormSpells.Count);
        Assert.Equal(14.0, result.StormSpells.MeanHours);
        Assert.Equal(1, result.StormSpells.CensoredCount); // the last ends at the record end
        Assert.Equal(31, result.StormSpells.Classes.Single(c => c.LowerHours == 12).Count); // [12, 24) h
    }

    [Fact]
    public void GapBreaksAWindowAndLeavesUnknownStepsOut()
    {
        var values = TenCalmHoursADay();
        values[9 * 24 + 2] = double.NaN; // 10 January, 02:00 missing: that day's calm spell becomes 2 h + 7 h

        var january = WeatherWindowAnalysis.Analyse(new RegularSeries(January2021, Hour, values), null, HsBelowOneAndAHalf, 6).Months[0];

        // That day: hours 0 and 1 reach the gap before 6 h (unknown), hour 2 is missing (unknown);
        // hours 3 and 4 start windows (7 h spell), hours 5..9 meet the storm at 10 (determined, no start).
        Assert.Equal(741, january.DeterminedSteps);
        Assert.Equal(155 - 5 + 2, january.WindowStartSteps);
        Assert.Equal(31, january.WindowCount); // the 7 h spell is still a window
        // Waits cut by the gap: 9 January hours 5..23 (19 steps) and 10 January hours 0..2 (3 steps) join the
        // 19 unknown steps of 31 January. 9 January no longer waits to 00:00 but is unknown; 10 January 03:00 and 04:00 wait 0.
        Assert.Equal(744 - 19 - 19 - 3, january.WaitingSamples);
        double expectedWaitSum = 29 * 190.0; // days with a normal next-day wait, minus 9 January
        Assert.Equal(expectedWaitSum / january.WaitingSamples, january.MeanWaitingHours, 1e-12);
        Assert.Equal(743, january.Accessibility.ValidSteps);
        Assert.Equal(743.0 / 744, january.EquivalentMonths, 1e-12);
    }

    [Fact]
    public void WindowNeverSpansAGapEvenWhenBothSidesAreCalm()
    {
        var values = Enumerable.Repeat(1.0, 48).ToArray();
        values[5] = double.NaN; // calm 0-4 (5 h), gap, calm 6-47 (42 h)
        values[20] = 3.0;        // storm splits the second spell into 6-19 (14 h) and 21-47 (27 h)

        var result = WeatherWindowAnalysis.Analyse(new RegularSeries(January2021, Hour, values), null, HsBelowOneAndAHalf, 6);

        Assert.Equal(2, result.Months[0].WindowCount);
        Assert.Equal(3, result.CalmSpells.Count);
        // 0-4 touches the record start and the gap, 6-19 the gap, 21-47 the record end: all three are censored.
        Assert.Equal(3, result.CalmSpells.CensoredCount);
        Assert.Equal(27.0, result.CalmSpells.MaximumHours);
    }

    [Fact]
    public void TpLimitMakesLongPeriodStepsStormy()
    {
        var hs = new RegularSeries(January2021, Hour, Enumerable.Repeat(1.0, 24).ToArray());
        var tpValues = Enumerable.Repeat(8.0, 24).ToArray();
        for (int i = 8; i < 12; i++) tpValues[i] = 14.0; // swell beyond a 12 s limit
        tpValues[20] = double.NaN;
        var tp = new RegularSeries(January2021, Hour, tpValues);

        var result = WeatherWindowAnalysis.Analyse(hs, tp, new AccessLimits(1.5, 12.0), 4);

        // Calm 0-7 (8 h), storm 8-11, calm 12-19 (8 h), missing 20, calm 21-23 (3 h).
        Assert.Equal(3, result.CalmSpells.Count);
        Assert.Equal(1, result.StormSpells.Count);
        Assert.Equal(4.0, result.StormSpells.MeanHours);
        Assert.Equal(2, result.Months[0].WindowCount);
        Assert.Equal(new AccessibilityFraction(19, 23), result.Accessibility);
        Assert.Throws<ArgumentException>(() => WeatherWindowAnalysis.Analyse(hs, null, new AccessLimits(1.5, 12.0), 4));
    }

    [Fact]
    public void DurationIsRoundedUpToWholeSteps()
    {
        // 3-hourly steps: a 7 h window needs 3 steps (9 h). Calm runs of 2 steps (6 h) and 3 steps (9 h).
        double[] values = [1, 1, 2, 1, 1, 1, 2, 2];
        var result = WeatherWindowAnalysis.Analyse(new RegularSeries(January2021, 3 * Hour, values), null, HsBelowOneAndAHalf, 7);

        Assert.Equal(3, result.RequiredSteps);
        Assert.Equal(1, result.Months[0].WindowStartSteps);
        Assert.Equal(1, result.Months[0].WindowCount);
        Assert.Equal(7.5, result.CalmSpells.MeanHours);
        Assert.Equal(9.0, result.CalmSpells.MaximumHours);
    }

    [Fact]
    public void MonthsAreKeptApartAndAWindowBelongsToTheMonthItStarts()
    {
        // 31 January 20:00 to 1 February 08:00 calm, everything else stormy.
        var values = Enumerable.Repeat(3.0, 59 * 24).ToArray();
        for (int i = 30 * 24 + 20; i < 31 * 24 + 8; i++) values[i] = 1.0;

        var result = WeatherWindowAnalysis.Analyse(new RegularSeries(January2021, Hour, values), null, HsBelowOneAndAHalf, 6);

        Assert.Equal(1, result.Months[0].WindowCount);
        Assert.Equal(0, result.Months[1].WindowCount);
        // Starts at 20:00 .. 02:00 (7 steps): 4 in January, 3 in February.
        Assert.Equal(4, result.Months[0].WindowStartSteps);
        Assert.Equal(3, result.Months[1].WindowStartSteps);
        Assert.Equal(1.0, result.Months[1].EquivalentMonths, 1e-12);
    }

    [Fact]
    public void AccessibilityFractionSkipsMissingSteps()
    {
        var fraction = Accessibility.Of([1.0, 2.0, double.NaN, 1.5], [], HsBelowOneAndAHalf);

        Assert.Equal(new AccessibilityFraction(2, 3), fraction); // 1.5 m is at the limit, which counts as within it
        Assert.True(double.IsNaN(Accessibility.Of([double.NaN], [], HsBelowOneAndAHalf).Fraction));
    }
}
