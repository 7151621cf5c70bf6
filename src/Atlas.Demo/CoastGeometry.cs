namespace Atlas.Demo;

/// <summary>
/// The invented coast of Skelvane Reach, defined analytically in a local kilometre frame so that
/// any grid resolution samples the same geography: x runs east and y north from the south-west
/// corner of <see cref="Bounds"/>. The mainland fills the east side and continues beyond the box
/// to north and south; Corrack Head is a hooked headland whose tip curls south, Feltrum Isle lies
/// off the mouth of Quellmouth Bay, which the two shelter from the west and south-west.
/// </summary>
public static class CoastGeometry
{
    /// <summary>Name of the invented stretch of coast.</summary>
    public const string PlaceName = "Skelvane Reach";

    /// <summary>Name of the hooked headland.</summary>
    public const string HeadlandName = "Corrack Head";

    /// <summary>Name of the island off the bay mouth.</summary>
    public const string IslandName = "Feltrum Isle";

    /// <summary>Name of the sheltered bay.</summary>
    public const string BayName = "Quellmouth Bay";

    /// <summary>
    /// Outer edges of the grid, in open North Atlantic water near 50 N, 27 W, several hundred
    /// kilometres from any real land (the nearest real islands lie more than 1000 km south).
    /// </summary>
    public static GeoBox Bounds { get; } = new(-28.0, -25.3, 49.3, 50.7);

    /// <summary>Mean Earth radius used for the local frame, km.</summary>
    public const double EarthRadiusKm = 6371.0;

    /// <summary>Kilometres per degree of latitude.</summary>
    public static readonly double KmPerDegreeLatitude = Math.PI * EarthRadiusKm / 180.0;

    /// <summary>Kilometres per degree of longitude at the frame's reference latitude (50 N).</summary>
    public static readonly double KmPerDegreeLongitude = KmPerDegreeLatitude * Math.Cos(50.0 * Math.PI / 180.0);

    /// <summary>Local x (km east of the west edge) of a longitude.</summary>
    public static double XKm(double longitude) => (longitude - Bounds.West) * KmPerDegreeLongitude;

    /// <summary>Local y (km north of the south edge) of a latitude.</summary>
    public static double YKm(double latitude) => (latitude - Bounds.South) * KmPerDegreeLatitude;

    // The headland is a chain of capsules: a point within the local radius of the polyline is land.
    private static readonly (double X, double Y, double Radius)[] HeadlandSpine =
    [
        (170.0, 116.0, 4.2),
        (152.0, 110.0, 3.6),
        (140.0, 102.0, 3.2),
        (135.5, 92.0, 2.8),
        (137.0, 83.0, 2.3),
    ];

    private const double IslandCentreX = 146.0, IslandCentreY = 73.0;
    private const double IslandSemiAxisAKm = 6.5, IslandSemiAxisBKm = 3.8;
    private static readonly double IslandAngle = 35.0 * Math.PI / 180.0;

    /// <summary>
    /// x of the mainland shore at <paramref name="yKm"/>: land lies east of it. Long gentle
    /// undulations plus the eastward recess that forms the bay.
    /// </summary>
    public static double MainlandShoreXKm(double yKm)
    {
        double baseline = 162.0 + 5.0 * Math.Sin(2 * Math.PI * yKm / 150.0 + 0.6) + 2.0 * Math.Sin(2 * Math.PI * yKm / 41.0 + 2.1);
        double bay = (yKm - 94.0) / 15.0;
        return baseline + 14.0 * Math.Exp(-bay * bay * bay * bay);
    }

    /// <summary>True when the point (km) is land: mainland, headland or island.</summary>
    public static bool IsLand(double xKm, double yKm)
    {
        // The mainland shore never runs west of 155 km, which spares most calls the trigonometry.
        if (xKm >= 155.0 && xKm >= MainlandShoreXKm(yKm)) return true;
        if (xKm > 128.0 && xKm < 180.0 && yKm > 76.0 && yKm < 124.0 && IsHeadland(xKm, yKm)) return true;
        return IsIsland(xKm, yKm);
    }

    /// <summary>Westernmost x of any land, km; rays west of it that head west meet no land.</summary>
    public const double WesternmostLandXKm = 132.0;

    private static bool IsHeadland(double x, double y)
    {
        for (int i = 0; i + 1 < HeadlandSpine.Length; i++)
        {
            var (ax, ay, ar) = HeadlandSpine[i];
            var (bx, by, br) = HeadlandSpine[i + 1];
            double dx = bx - ax, dy = by - ay;
            double t = Math.Clamp(((x - ax) * dx + (y - ay) * dy) / (dx * dx + dy * dy), 0.0, 1.0);
            double px = ax + t * dx - x, py = ay + t * dy - y;
            double radius = ar + t * (br - ar);
            if (px * px + py * py <= radius * radius) return true;
        }
        return false;
    }

    private static bool IsIsland(double x, double y)
    {
        double dx = x - IslandCentreX, dy = y - IslandCentreY;
        if (Math.Abs(dx) > IslandSemiAxisAKm || Math.Abs(dy) > IslandSemiAxisAKm) return false;
        double c = Math.Cos(IslandAngle), s = Math.Sin(IslandAngle);
        double u = (dx * c + dy * s) / IslandSemiAxisAKm;
        double v = (-dx * s + dy * c) / IslandSemiAxisBKm;
        return u * u + v * v <= 1.0;
    }

    /// <summary>
    /// Sea-floor depth (m) of a wet point from its distance to the nearest land (km): a concave
    /// shelf profile from about 5 m at the shore to about 160 m some 150 km offshore, with low
    /// sand banks whose relief grows with depth. Never shallower than 4 m.
    /// </summary>
    public static double DepthMetres(double distanceToLandKm, double xKm, double yKm)
    {
        double shelf = 4.0 + 175.0 * (1.0 - Math.Exp(-distanceToLandKm / 75.0));
        double banks = 0.06 * shelf * Math.Sin(xKm / 9.0 + 0.4) * Math.Cos(yKm / 13.0 - 0.9);
        return Math.Max(4.0, shelf + banks);
    }
}
