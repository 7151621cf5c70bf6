namespace Atlas.Demo.Tests;

[Collection(FullModelCollection.Name)]
public class CoastAndClimateTests(FullModelFixture full)
{
    // Offshore strip: the westernmost 40 km, 120 km and more from the coast in 140-160 m of water.
    private int[] Offshore => full.CellsIn(0, 40, 20, 135);

    // Quellmouth Bay inside the hook of Corrack Head, away from its mouth.
    private int[] Bay => full.CellsIn(150, 185, 86, 110);

    [Fact]
    public void FullGridHasAFewThousandWetCellsAndSomeLand()
    {
        var grid = full.Grid;
        Assert.Equal(90 * 70, grid.IsLand.Length);
        Assert.InRange(grid.WetCount, 3000, 6000);
        Assert.InRange(grid.IsLand.Count(l => l), 600, 3000);
        // The grid's east edge is mainland and its west edge open sea.
        Assert.True(Enumerable.Range(0, grid.Rows).All(j => grid.IsLand[j * grid.Columns + grid.Columns - 1]));
        Assert.True(Enumerable.Range(0, grid.Rows).All(j => !grid.IsLand[j * grid.Columns]));
    }

    [Fact]
    public void DepthDeepensFromAShallowShoreToTheShelfOffTheWestEdge()
    {
        var grid = full.Grid;
        Assert.InRange(grid.DepthMetres.Min(), 4.0, 8.0);
        Assert.True(Offshore.Average(k => grid.DepthMetres[k]) > 140.0);
        Assert.True(grid.DepthMetres.Max() >= 150.0);
        // Depth grows with distance from the shore (a shelf, not a basin): Spearman-like check on bands.
        double near = Enumerable.Range(0, grid.WetCount).Where(k => grid.ShoreDistanceKm[k] < 5).Average(k => grid.DepthMetres[k]);
        double mid = Enumerable.Range(0, grid.WetCount).Where(k => grid.ShoreDistanceKm[k] is > 30 and < 50).Average(k => grid.DepthMetres[k]);
        Assert.True(near < 20 && mid > 50, $"near-shore {near:F1} m, mid-shelf {mid:F1} m");
    }

    [Fact]
    public void ShelteredBayMeanHsIsMarkedlyLowerThanOpenOffshore()
    {
        // One year, 12-hourly: the bay behind the headland and island keeps under 60 % of the
        // offshore mean (sheltering, depth limitation), which a wave climate atlas should show.
        double offshore = MeanHs(Offshore, months: 12, stepHours: 12);
        double bay = MeanHs(Bay, months: 12, stepHours: 12);
        Assert.True(Bay.Length >= 30, $"{Bay.Length} bay cells");
        Assert.True(bay < 0.6 * offshore, $"bay {bay:F2} m, offshore {offshore:F2} m");
    }

    [Fact]
    public void LeeOfTheHeadlandIsCalmerThanItsExposedSide()
    {
        // Just east of the hook (inside) against just west of it (outside), same latitudes.
        double inside = MeanHs(full.CellsIn(140, 146, 88, 100), months: 12, stepHours: 12);
        double outside = MeanHs(full.CellsIn(120, 128, 88, 100), months: 12, stepHours: 12);
        Assert.True(inside < 0.5 * outside, $"inside {inside:F2} m, outside {outside:F2} m");
    }

    [Fact]
    public void HsNeverExceedsTheMcCowanBreakingLimit()
    {
        // McCowan (1894), solitary-wave breaking H / h = 0.78 (from memory); the significant height
        // stays below it everywhere. Every cell through the ten days round the biggest offshore
        // storm, and the cells under 20 m deep through a whole winter, 3-hourly.
        var grid = full.Grid;
        var offshore = Offshore[Offshore.Length / 2];
        var peak = full.Series(offshore, 3).MaxBy(s => s.State.Hs).Time;
        double worst = 0;
        for (int k = 0; k < grid.WetCount; k++)
            for (var t = peak.AddDays(-5); t < peak.AddDays(5); t = t.AddHours(3))
                worst = Math.Max(worst, full.Model.Evaluate(k, t).Hs / grid.DepthMetres[k]);
        var winter = new DateTime(2021, 11, 1, 0, 0, 0, DateTimeKind.Utc);
        foreach (int k in Enumerable.Range(0, grid.WetCount).Where(k => grid.DepthMetres[k] < 20))
            for (var t = winter; t < winter.AddMonths(4); t = t.AddHours(3))
                worst = Math.Max(worst, full.Model.Evaluate(k, t).Hs / grid.DepthMetres[k]);
        Assert.True(worst <= 0.78, $"largest Hs / h {worst:F3}");
        // And the shallow cells do feel the limit in storms (the saturation is active, not idle).
        Assert.True(worst > 0.45, $"largest Hs / h {worst:F3}");
    }

    [Fact]
    public void WinterMeanHsExceedsSummerMeanOffshore()
    {
        // North-east Atlantic near 50 N (common practice, from memory): winter mean Hs offshore
        // about 3-4 m, summer about 1.5 m.
        var offshore = Offshore[Offshore.Length / 2];
        var series = full.Series(offshore, 3).ToArray();
        double winter = series.Where(s => s.Time.Month is 12 or 1 or 2).Average(s => s.State.Hs);
        double summer = series.Where(s => s.Time.Month is 6 or 7 or 8).Average(s => s.State.Hs);
        Assert.True(winter > 1.8 * summer, $"winter {winter:F2} m, summer {summer:F2} m");
        Assert.InRange(winter, 3.0, 4.5);
        Assert.InRange(summer, 1.0, 2.0);
    }

    [Fact]
    public void EveryWinterHasStormsOfSevenToThirteenMetresOffshore()
    {
        var offshore = Offshore[Offshore.Length / 2];
        var series = full.Series(offshore, 3).ToArray();
        foreach (int year in Enumerable.Range(full.Options.Start.Year, full.Options.End.Year - full.Options.Start.Year))
        {
            double peak = series.Where(s => s.Time.Year == year).Max(s => s.State.Hs);
            Assert.InRange(peak, 7.0, 13.0);
        }
        // A storm lasts one to three days: the longest run above 6 m stays under four days.
        int longest = 0, run = 0;
        foreach (var s in series) { run = s.State.Hs > 6 ? run + 1 : 0; longest = Math.Max(longest, run); }
        Assert.InRange(longest * 3, 6, 96);
    }

    [Fact]
    public void PeriodsAndSteepnessStayPhysical()
    {
        var offshore = Offshore[Offshore.Length / 2];
        var states = full.Series(offshore, 3).Select(s => s.State).ToArray();
        var ratios = states.Select(s => s.Te / s.Tp).Order().ToArray();
        // Te / Tp: 0.9 for JONSWAP, 0.857 for Pierson-Moskowitz (IEC TS 62600-101, from memory);
        // mixed seas spread it, but the median sits near those values (tolerance 0.05).
        Assert.InRange(ratios[ratios.Length / 2], 0.81, 0.92);
        // Steepness Hs / L0p stays under 1/15, well below wave breaking (common practice).
        double steepest = states.Max(s => s.Hs / (ShoalingTable.Gravity * s.Tp * s.Tp / (2 * Math.PI)));
        Assert.True(steepest < 1.0 / 15, $"steepest {steepest:F3}");
        Assert.All(states, s => Assert.True(s.Te > 0 && s.Tp > 0 && s.SpreadDegrees > 0 && s.FromDegrees is >= 0 and < 360));
    }

    [Fact]
    public void WavesComeMostlyFromTheOpenOceanWithOccasionalOtherDirections()
    {
        var offshore = Offshore[Offshore.Length / 2];
        var directions = full.Series(offshore, 3).Select(s => s.State.FromDegrees).ToArray();
        double westerly = directions.Count(d => d is >= 200 and <= 300) / (double)directions.Length;
        Assert.InRange(westerly, 0.7, 0.97);
    }

    [Fact]
    public void RefractionTurnsShallowWaterWavesTowardsTheShoreNormal()
    {
        // An open-coast cell in under 15 m of water against the offshore cell at the same latitude:
        // Snell's law narrows the range of directions (circular standard deviation
        // sqrt(-2 ln R), R the mean resultant length; Mardia and Jupp 2000, from memory).
        var coastal = full.CellsIn(140, 170, 20, 45).Where(k => full.Grid.DepthMetres[k] < 15).First();
        var offshore = full.CellsIn(0, 10, full.Grid.YKm[coastal] - 2, full.Grid.YKm[coastal] + 2).First();
        Assert.True(CircularDeviation(coastal) < 0.8 * CircularDeviation(offshore),
            $"coastal {CircularDeviation(coastal):F1}, offshore {CircularDeviation(offshore):F1} degrees");
    }

    [Fact]
    public void WindSeaIsWiderInDirectionThanSwell()
    {
        // Offshore states dominated by short periods (wind sea) against long-period swells.
        var offshore = Offshore[Offshore.Length / 2];
        var states = full.Series(offshore, 3).Select(s => s.State).ToArray();
        double windSea = states.Where(s => s.Tp < 7).Average(s => s.SpreadDegrees);
        double swell = states.Where(s => s.Tp > 12 && s.Hs < 3).Average(s => s.SpreadDegrees);
        Assert.True(windSea > swell + 5, $"wind sea {windSea:F1}, swell {swell:F1} degrees");
    }

    private double CircularDeviation(int k)
    {
        double e = 0, n = 0;
        int count = 0;
        foreach (var (_, s) in full.Series(k, 6))
        {
            e += Math.Sin(s.FromDegrees * Math.PI / 180);
            n += Math.Cos(s.FromDegrees * Math.PI / 180);
            count++;
        }
        double r = Math.Sqrt(e * e + n * n) / count;
        return Math.Sqrt(-2 * Math.Log(r)) * 180 / Math.PI;
    }

    private double MeanHs(int[] cells, int months, int stepHours)
    {
        double sum = 0;
        int count = 0;
        var end = full.Options.Start.AddMonths(months);
        foreach (int k in cells)
        {
            for (var t = full.Options.Start; t < end; t = t.AddHours(stepHours))
            {
                sum += full.Model.Evaluate(k, t).Hs;
                count++;
            }
        }
        return sum / count;
    }
}
