namespace Atlas.Demo;

/// <summary>
/// The sea state at any wet cell and instant: the offshore forcing, delayed by its travel across
/// the grid, is transformed at the cell. The swell is sheltered by land that blocks its
/// directions (<see cref="ShelterTable"/>), refracted towards the open-water direction
/// (<see cref="ShelterTable.OpenWaterFromDegrees"/>) by Snell's law over locally straight depth
/// contours, and shoaled (<see cref="ShoalingTable"/>); the wind sea grows over the cell's fetch
/// in the wind direction (<see cref="WindSeaGrowth"/>) and shoals. The two
/// systems are combined (<see cref="SeaStateMix"/>) and the height saturates smoothly below the
/// depth limit: Hs = Hb tanh(Hs' / Hb), Hb = <see cref="BreakingIndex"/> h, so it never exceeds
/// that fraction of the depth.
/// </summary>
public sealed class SeaStateModel
{
    /// <summary>
    /// Largest Hs / h of the model, 0.6: within the 0.55-0.78 range used for the significant
    /// height in a saturated surf zone (common practice), below McCowan's 0.78 for a single wave.
    /// </summary>
    public const double BreakingIndex = 0.6;

    /// <summary>Speed at which weather and swell cross the grid from the west, km/h.</summary>
    public const double TravelSpeedKmPerHour = 40.0;

    private readonly DemoGrid _grid;
    private readonly FetchRays _rays;
    private readonly ShelterTable _shelter;
    private readonly ShoalingTable _shoaling;
    private readonly double[] _lagHours;
    private readonly double[] _swellScale;
    private readonly double[] _normalEast, _normalNorth;

    /// <summary>The forcing the model transforms.</summary>
    public OffshoreForcing Forcing { get; }

    /// <summary>The grid the model covers.</summary>
    public DemoGrid Grid => _grid;

    /// <summary>Builds the per-cell tables of <paramref name="grid"/> for <paramref name="forcing"/>.</summary>
    public SeaStateModel(DemoGrid grid, OffshoreForcing forcing)
    {
        ArgumentNullException.ThrowIfNull(grid);
        ArgumentNullException.ThrowIfNull(forcing);
        _grid = grid;
        Forcing = forcing;
        _rays = new FetchRays(grid);
        _shelter = new ShelterTable(_rays, grid.WetCount);
        _shoaling = new ShoalingTable(grid.DepthMetres);
        _lagHours = new double[grid.WetCount];
        _swellScale = new double[grid.WetCount];
        _normalEast = new double[grid.WetCount];
        _normalNorth = new double[grid.WetCount];
        double yMid = 0.5 * CoastGeometry.YKm(CoastGeometry.Bounds.North);
        for (int k = 0; k < grid.WetCount; k++)
        {
            _lagHours[k] = grid.XKm[k] / TravelSpeedKmPerHour;
            // Swell energy grows slightly to the north, towards the storm tracks.
            _swellScale[k] = 1.0 + 0.05 * (grid.YKm[k] / yMid - 1.0);
            (_normalEast[k], _normalNorth[k]) = Math.SinCos(_shelter.OpenWaterFromDegrees(k) * Math.PI / 180.0);
        }
    }

    /// <summary>The sea state of wet cell k at <paramref name="utc"/>.</summary>
    public SeaState Evaluate(int k, DateTime utc) => Evaluate(k, (utc - Forcing.Origin).TotalHours);

    /// <summary>
    /// The sea state of wet cell k at <paramref name="hoursSinceOrigin"/> hours after the forcing
    /// origin; the forcing is interpolated linearly between its hourly values.
    /// </summary>
    public SeaState Evaluate(int k, double hoursSinceOrigin)
    {
        var f = Forcing;
        double t = hoursSinceOrigin - _lagHours[k];
        if (t < 0 || t > f.Hours - 1)
            throw new ArgumentOutOfRangeException(nameof(hoursSinceOrigin), hoursSinceOrigin, "The instant lies outside the generated forcing.");
        int i = Math.Min((int)t, f.Hours - 2);
        double w = t - i;
        static double Lerp(float[] a, int i, double w) => a[i] + w * (a[i + 1] - a[i]);

        double depth = _grid.DepthMetres[k];
        var mix = new SeaStateMix();

        // Swell: shelter, then refraction and shoaling.
        double swellHs = Lerp(f.SwellHeight, i, w) * _swellScale[k];
        double swellTp = Lerp(f.SwellPeakPeriod, i, w);
        double swellFrom = f.SwellFromDegrees[i] + w * (f.SwellFromDegrees[i + 1] - f.SwellFromDegrees[i]);
        double swellSpread = Lerp(f.SwellSpread, i, w);
        (double passed, double turn, double spreadRatio) = _shelter.Look(k, swellFrom, swellSpread);
        double incidence = WrapSigned(swellFrom + turn - _shelter.OpenWaterFromDegrees(k));
        // A swell running along or away from the shore never reaches the cell from deep water:
        // the refraction coefficient falls to zero as the incidence nears 90 degrees.
        if (Math.Abs(incidence) < 90.0)
        {
            (double speedRatio, double shoaling) = _shoaling.Look(k, swellTp);
            // Snell: sin(a) = sin(a0) c / c0; Kr = sqrt(cos a0 / cos a); both angles within 90 degrees.
            double sinA0 = Math.Sin(incidence * Math.PI / 180.0);
            double cosA0 = Math.Sqrt(1 - sinA0 * sinA0);
            double sinA = sinA0 * speedRatio;
            double cosA = Math.Sqrt(1 - sinA * sinA);
            swellHs *= Math.Sqrt(passed) * shoaling * Math.Sqrt(cosA0 / cosA);
            // Refraction narrows the directional spread as the crests straighten.
            swellSpread *= spreadRatio * (0.55 + 0.45 * speedRatio);
            double normalEast = _normalEast[k], normalNorth = _normalNorth[k];
            double east = normalEast * cosA + normalNorth * sinA;
            double north = normalNorth * cosA - normalEast * sinA;
            mix.Add(swellHs, swellTp, OffshoreForcing.SwellEnergyPeriodRatio * swellTp, east, north, swellSpread);
        }

        // Wind sea over the cell's own fetch.
        double windSpeed = Lerp(f.WindSpeed, i, w);
        double windFrom = f.WindFromDegrees[i] + w * (f.WindFromDegrees[i + 1] - f.WindFromDegrees[i]);
        (double seaHs, double seaTp, double seaTe, double seaSpread) = WindSeaGrowth.Grow(
            windSpeed, Lerp(f.WindSpeedCubeRoot, i, w), _rays.DistanceKm(k, windFrom), _rays.CubeRootDistanceKm(k, windFrom));
        if (seaHs > 0)
        {
            (_, double seaShoaling) = _shoaling.Look(k, seaTp);
            double windEast = Lerp(f.WindFromEast, i, w), windNorth = Lerp(f.WindFromNorth, i, w);
            double length = Math.Sqrt(windEast * windEast + windNorth * windNorth);
            if (length > 0) mix.Add(seaHs * seaShoaling, seaTp, seaTe, windEast / length, windNorth / length, seaSpread);
        }

        (double hs, double tp, double te, double from, double spread) = mix.Result();
        if (double.IsNaN(hs))
        {
            // Flat calm with the swell shut out: a small residual sea keeps the state defined.
            double calmFrom = windFrom - 360.0 * Math.Floor(windFrom / 360.0);
            return new SeaState(0.05, 2.1, 2.3, calmFrom >= 360.0 ? 0.0 : calmFrom, 40.0);
        }
        double limit = BreakingIndex * depth;
        hs = limit * Saturate(hs / limit);
        return new SeaState(hs, te, tp, from, spread);
    }

    // Into [-180, 180]; rounding is an instruction where the remainder operator is a library call.
    private static double WrapSigned(double degrees) => degrees - 360.0 * Math.Round(degrees * (1.0 / 360.0));

    // tanh(x) for x >= 0; below 0.05 its series to x^5 is exact to double rounding level
    // (the next term is 17 x^7 / 315 < 4e-11 x), and much cheaper than the library call.
    private static double Saturate(double x)
    {
        if (x >= 0.05) return Math.Tanh(x);
        double x2 = x * x;
        return x * (1.0 - x2 * (1.0 / 3.0 - x2 * (2.0 / 15.0)));
    }
}
