namespace Atlas.Hindcast.Geodesy;

/// <summary>
/// Areas of longitude/latitude polygons on the WGS 84 spheroid, through the authalic (equal-area) latitude:
/// each edge contributes (lambda2 - lambda1)(sin beta1 + sin beta2) / 2 on the authalic sphere. The result is exact
/// for a cell bounded by two meridians and two parallels, and for small polygons with straight lon/lat edges
/// differs from a geodesic-edge area only by the edge curvature (well below 1e-4 for cells of a few km).
/// </summary>
public static class AuthalicArea
{
    public const double SemiMajorAxisMetres = 6378137.0;
    public const double Flattening = 1 / 298.257223563;

    private static readonly double E2 = Flattening * (2 - Flattening);
    private static readonly double E = Math.Sqrt(E2);
    private static readonly double QPole = Q(1.0);

    /// <summary>Radius squared of the sphere with the spheroid's area, m2.</summary>
    private static readonly double AuthalicRadiusSquared = SemiMajorAxisMetres * SemiMajorAxisMetres * QPole / 2;

    /// <summary>Area of a ring (closed or not) of (longitude, latitude) degrees, m2, whatever its orientation.</summary>
    public static double RingSquareMetres(ReadOnlySpan<(double Longitude, double Latitude)> ring)
    {
        if (ring.Length < 3) return 0;
        double sum = 0;
        for (var k = 0; k < ring.Length; k++)
        {
            var (lon1, lat1) = ring[k];
            var (lon2, lat2) = ring[(k + 1) % ring.Length];
            sum += DegreesToRadians(lon2 - lon1) * (SinAuthalic(lat1) + SinAuthalic(lat2)) / 2;
        }
        return Math.Abs(sum) * AuthalicRadiusSquared;
    }

    /// <summary>Area between two meridians and two parallels, m2.</summary>
    public static double RectangleSquareMetres(double west, double south, double east, double north) =>
        Math.Abs(DegreesToRadians(east - west) * (SinAuthalic(north) - SinAuthalic(south))) * AuthalicRadiusSquared;

    /// <summary>sin of the authalic latitude of a geodetic latitude in degrees.</summary>
    public static double SinAuthalic(double latitudeDegrees) => Q(Math.Sin(DegreesToRadians(latitudeDegrees))) / QPole;

    // q(phi) of the authalic latitude (Snyder 1987, eq. 3-12), from sin(phi).
    private static double Q(double sinPhi)
    {
        var es = E * sinPhi;
        return (1 - E2) * (sinPhi / (1 - es * es) - 1 / (2 * E) * Math.Log((1 - es) / (1 + es)));
    }

    private static double DegreesToRadians(double degrees) => degrees * Math.PI / 180;
}
