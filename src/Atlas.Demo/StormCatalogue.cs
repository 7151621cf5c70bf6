namespace Atlas.Demo;

/// <summary>
/// Draws the storms of a scenario: arrivals are a Poisson process whose rate follows the season
/// (about 3.5 a month in midwinter, under 1 a month in midsummer), each with a duration of one to
/// three days and a peak added wind that, on top of the background wind and swell, gives offshore
/// Hs peaks of roughly 7 to 12 m in winter and 4 to 7 m in summer.
/// </summary>
public static class StormCatalogue
{
    /// <summary>Storms starting in [0, <paramref name="hours"/>) after an origin at <paramref name="origin"/>.</summary>
    public static IReadOnlyList<Storm> Draw(Xoshiro256StarStar random, DateTime origin, int hours)
    {
        ArgumentNullException.ThrowIfNull(random);
        var storms = new List<Storm>();
        // Thinning of a Poisson process with the winter rate as the envelope.
        const double maximumRatePerHour = 0.12 / 24.0;
        double t = 0;
        while (true)
        {
            t += -Math.Log(1.0 - random.NextDouble()) / maximumRatePerHour;
            if (t >= hours) break;
            double season = SeasonalPhase.Winterness(origin.AddHours(t));
            double rate = (0.075 + 0.045 * season) / 24.0;
            if (random.NextDouble() * maximumRatePerHour > rate) continue;
            double duration = random.NextUniform(24.0, 72.0);
            double peakWind = random.NextUniform(11.0 + 2.0 * season, 16.0 + 3.0 * season);
            double startDirection = random.NextUniform(200.0, 240.0);
            double veer = random.NextUniform(35.0, 80.0);
            double swellHeight = 0.12 * peakWind * random.NextUniform(0.8, 1.2);
            double swellPeriod = Math.Clamp(12.5 + 0.5 * (peakWind - 11.0) + random.NextUniform(-0.8, 0.8), 11.0, 18.5);
            storms.Add(new Storm(t, duration, peakWind, startDirection, startDirection + veer, swellHeight, swellPeriod));
        }
        return storms;
    }
}
