namespace Atlas.Demo;

/// <summary>
/// Hourly deep-water forcing at the west edge of the grid: a swell system (background swell from
/// the west to south-west plus the swells storms leave behind) and the surface wind that raises
/// local wind sea. Every series comes from seeded first-order autoregressive processes on top of
/// the seasonal cycle, so a seed fixes the whole history. Hour 0 lies <see cref="SpinUpHours"/>
/// before the scenario start, which lets the filters settle and covers the travel lag across the
/// grid.
/// </summary>
public sealed class OffshoreForcing
{
    /// <summary>Hours of forcing before the scenario start.</summary>
    public const int SpinUpHours = 48;

    // Random streams of the scenario seed; the buoys use their own streams.
    internal const ulong SwellStream = 1, WindStream = 2, StormStream = 3;

    /// <summary>
    /// Te / Tp of a swell: 0.9, the JONSWAP (gamma 3.3) ratio (IEC TS 62600-101, from memory);
    /// a swell is at least as narrow-banded as that.
    /// </summary>
    public const double SwellEnergyPeriodRatio = 0.9;

    /// <summary>Hour 0 of the series (UTC).</summary>
    public DateTime Origin { get; }

    /// <summary>Number of hourly values.</summary>
    public int Hours { get; }

    /// <summary>Swell significant height, m.</summary>
    public float[] SwellHeight { get; }

    /// <summary>Swell peak period, s.</summary>
    public float[] SwellPeakPeriod { get; }

    /// <summary>
    /// Swell mean direction (coming from), degrees true, unwrapped: consecutive hours never
    /// differ by more than 180 degrees, so the series interpolates linearly; reduce modulo 360.
    /// </summary>
    public double[] SwellFromDegrees { get; }

    /// <summary>Swell directional spread, degrees.</summary>
    public float[] SwellSpread { get; }

    /// <summary>Wind speed effective for wave growth (smoothed over a few hours), m/s.</summary>
    public float[] WindSpeed { get; }

    /// <summary>Cube root of <see cref="WindSpeed"/>, tabulated for the wind-sea period law.</summary>
    public float[] WindSpeedCubeRoot { get; }

    /// <summary>Wind direction (coming from), degrees true, unwrapped like <see cref="SwellFromDegrees"/>.</summary>
    public double[] WindFromDegrees { get; }

    /// <summary>East component of the wind's unit "from" vector.</summary>
    public float[] WindFromEast { get; }

    /// <summary>North component of the wind's unit "from" vector.</summary>
    public float[] WindFromNorth { get; }

    /// <summary>The storms that shaped the series.</summary>
    public IReadOnlyList<Storm> Storms { get; }

    /// <summary>Generates the forcing from <paramref name="start"/> to <paramref name="end"/> (UTC) with seed <paramref name="seed"/>.</summary>
    public OffshoreForcing(ulong seed, DateTime start, DateTime end)
    {
        if (end <= start) throw new ArgumentOutOfRangeException(nameof(end), end, "The forcing must end after it starts.");
        Origin = start.AddHours(-SpinUpHours);
        Hours = (int)(end - Origin).TotalHours + 2;
        SwellHeight = new float[Hours];
        SwellPeakPeriod = new float[Hours];
        SwellFromDegrees = new double[Hours];
        WindFromDegrees = new double[Hours];
        SwellSpread = new float[Hours];
        WindSpeed = new float[Hours];
        WindSpeedCubeRoot = new float[Hours];
        WindFromEast = new float[Hours];
        WindFromNorth = new float[Hours];
        Storms = StormCatalogue.Draw(new Xoshiro256StarStar(seed, StormStream), Origin.AddHours(-96), Hours + 96)
            .Select(s => s with { StartHour = s.StartHour - 96 })
            .ToArray();
        GenerateSwell(new Xoshiro256StarStar(seed, SwellStream));
        GenerateWind(new Xoshiro256StarStar(seed, WindStream));
    }

    private void GenerateSwell(Xoshiro256StarStar random)
    {
        var logHeight = new RedNoise(random, 60.0);
        var period = new RedNoise(random, 36.0);
        var direction = new RedNoise(random, 48.0);
        for (int h = 0; h < Hours; h++)
        {
            double season = SeasonalPhase.Winterness(Origin.AddHours(h));
            // Background swell: median about 2.2 m in winter and 1.0 m in summer, lognormal.
            double height = Math.Exp(Math.Log(1.5) + 0.40 * season + 0.33 * logHeight.Next());
            double peak = Math.Clamp(9.5 + 2.0 * Math.Log(height) + 1.0 * period.Next(), 7.0, 19.0);
            double from = 258.0 - 5.0 * season + 14.0 * direction.Next();
            double spread = Math.Clamp(34.0 - 1.2 * peak, 14.0, 30.0);
            var swell = new SeaStateMix();
            swell.Add(height, peak, SwellEnergyPeriodRatio * peak, from, spread);
            foreach (var storm in Storms)
            {
                double since = h - storm.PeakHour;
                if (since <= 0 || since > 240) continue;
                // Rises over a few hours after the wind peak, then decays with a 30 h e-folding
                // time; the period shortens slowly as the faster components pass first.
                double envelope = (1 - Math.Exp(-since / 4.0)) * Math.Exp(-since / 30.0);
                double stormHeight = storm.SwellHeightMetres * envelope;
                if (stormHeight < 0.02) continue;
                double stormPeriod = storm.SwellPeakPeriodSeconds * (1 - 0.12 * Math.Min(1.0, since / 72.0));
                swell.Add(stormHeight, stormPeriod, SwellEnergyPeriodRatio * stormPeriod, storm.EndFromDegrees, 22.0);
            }
            (double hs, double tp, _, double dir, double spr) = swell.Result();
            SwellHeight[h] = (float)hs;
            SwellPeakPeriod[h] = (float)tp;
            SwellFromDegrees[h] = h == 0 ? dir : Unwrap(SwellFromDegrees[h - 1], dir);
            SwellSpread[h] = (float)spr;
        }
    }

    private void GenerateWind(Xoshiro256StarStar random)
    {
        var east = new RedNoise(random, 30.0);
        var north = new RedNoise(random, 30.0);
        var gustEast = new RedNoise(random, 3.0);
        var gustNorth = new RedNoise(random, 3.0);
        // Smoothing gives the wind a memory of a few hours: a sea needs time to grow.
        const double speedMemoryHours = 5.0, directionMemoryHours = 3.0;
        double speedWeight = 1 - Math.Exp(-1 / speedMemoryHours), directionWeight = 1 - Math.Exp(-1 / directionMemoryHours);
        double smoothSpeed = 0, smoothEast = 0, smoothNorth = 0;
        for (int h = 0; h < Hours; h++)
        {
            double season = SeasonalPhase.Winterness(Origin.AddHours(h));
            double meanSpeed = 3.6 + 1.4 * season, deviation = 5.0 + 1.0 * season;
            double meanFrom = 245.0 * Math.PI / 180.0;
            // Components of the "from" vector times speed.
            double u = meanSpeed * Math.Sin(meanFrom) + deviation * east.Next() + 1.0 * gustEast.Next();
            double v = meanSpeed * Math.Cos(meanFrom) + deviation * north.Next() + 1.0 * gustNorth.Next();
            // Only the strongest storm blows at any hour: lows that overlap in the catalogue
            // stand for one deepening system, not for winds that add up.
            double stormSpeed = 0, stormFrom = 0;
            foreach (var storm in Storms)
            {
                double x = (h - storm.StartHour) / storm.DurationHours;
                if (x <= 0 || x >= 1) continue;
                double shape = Math.Sin(Math.PI * x);
                double speed = storm.PeakWindMetresPerSecond * shape * shape;
                if (speed <= stormSpeed) continue;
                stormSpeed = speed;
                stormFrom = (storm.StartFromDegrees + x * (storm.EndFromDegrees - storm.StartFromDegrees)) * Math.PI / 180.0;
            }
            u += stormSpeed * Math.Sin(stormFrom);
            v += stormSpeed * Math.Cos(stormFrom);
            double instantaneous = Math.Sqrt(u * u + v * v);
            if (h == 0) { smoothSpeed = instantaneous; smoothEast = u; smoothNorth = v; }
            smoothSpeed += speedWeight * (instantaneous - smoothSpeed);
            smoothEast += directionWeight * (u - smoothEast);
            smoothNorth += directionWeight * (v - smoothNorth);
            double length = Math.Sqrt(smoothEast * smoothEast + smoothNorth * smoothNorth);
            WindSpeed[h] = (float)smoothSpeed;
            WindSpeedCubeRoot[h] = (float)Math.Cbrt(smoothSpeed);
            double unitEast = length > 0 ? smoothEast / length : 0.0, unitNorth = length > 0 ? smoothNorth / length : 1.0;
            WindFromEast[h] = (float)unitEast;
            WindFromNorth[h] = (float)unitNorth;
            double windFrom = Math.Atan2(unitEast, unitNorth) * 180.0 / Math.PI;
            WindFromDegrees[h] = h == 0 ? windFrom : Unwrap(WindFromDegrees[h - 1], windFrom);
        }
    }

    // The angle equal to `degrees` modulo 360 that lies within 180 degrees of `previous`.
    private static double Unwrap(double previous, double degrees)
    {
        double step = (degrees - previous) % 360.0;
        if (step > 180.0) step -= 360.0;
        else if (step < -180.0) step += 360.0;
        return previous + step;
    }
}
