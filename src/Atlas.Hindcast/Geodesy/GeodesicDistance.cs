namespace Atlas.Hindcast.Geodesy;

/// <summary>
/// Distance along the WGS 84 ellipsoid between two positions, by Vincenty's inverse formula (Survey Review 23(176),
/// 1975), the same quantity as PostGIS's ST_Distance on geography (which agrees to well under a millimetre at
/// the distances a point query meets).
/// </summary>
public static class GeodesicDistance
{
    private const double SemiMajorAxis = 6378137.0;           // WGS 84 a, metres
    private const double Flattening = 1 / 298.257223563;       // WGS 84 f
    private const double SemiMinorAxis = SemiMajorAxis * (1 - Flattening);

    /// <summary>Metres between two positions given in degrees.</summary>
    /// <remarks>
    /// Vincenty's iteration fails to converge only for nearly antipodal points; there the great-circle distance on
    /// the sphere of the mean radius (IUGG, 6371.0088 km) is returned instead, which is within 0.5 % and far beyond
    /// any distance limit a point query allows.
    /// </remarks>
    public static double Metres(double latitude1, double longitude1, double latitude2, double longitude2)
    {
        const double radians = Math.PI / 180;
        double lambdaDifference = (longitude2 - longitude1) * radians;
        double u1 = Math.Atan((1 - Flattening) * Math.Tan(latitude1 * radians));
        double u2 = Math.Atan((1 - Flattening) * Math.Tan(latitude2 * radians));
        double sinU1 = Math.Sin(u1), cosU1 = Math.Cos(u1), sinU2 = Math.Sin(u2), cosU2 = Math.Cos(u2);

        double lambda = lambdaDifference;
        for (int iteration = 0; iteration < 200; iteration++)
        {
            double sinLambda = Math.Sin(lambda), cosLambda = Math.Cos(lambda);
            double sinSigma = Math.Sqrt(Square(cosU2 * sinLambda) + Square(cosU1 * sinU2 - sinU1 * cosU2 * cosLambda));
            if (sinSigma == 0) return 0;  // coincident points
            double cosSigma = sinU1 * sinU2 + cosU1 * cosU2 * cosLambda;
            double sigma = Math.Atan2(sinSigma, cosSigma);
            double sinAlpha = cosU1 * cosU2 * sinLambda / sinSigma;
            double cosSquaredAlpha = 1 - sinAlpha * sinAlpha;
            // On the equator cos^2(alpha) is 0 and the term below is taken as 0.
            double cos2SigmaM = cosSquaredAlpha == 0 ? 0 : cosSigma - 2 * sinU1 * sinU2 / cosSquaredAlpha;
            double c = Flattening / 16 * cosSquaredAlpha * (4 + Flattening * (4 - 3 * cosSquaredAlpha));
            double previous = lambda;
            lambda = lambdaDifference + (1 - c) * Flattening * sinAlpha *
                     (sigma + c * sinSigma * (cos2SigmaM + c * cosSigma * (-1 + 2 * cos2SigmaM * cos2SigmaM)));
            if (Math.Abs(lambda - previous) > 1e-12) continue;

            double uSquared = cosSquaredAlpha * (SemiMajorAxis * SemiMajorAxis - SemiMinorAxis * SemiMinorAxis) / (SemiMinorAxis * SemiMinorAxis);
            double a = 1 + uSquared / 16384 * (4096 + uSquared * (-768 + uSquared * (320 - 175 * uSquared)));
            double b = uSquared / 1024 * (256 + uSquared * (-128 + uSquared * (74 - 47 * uSquared)));
            double deltaSigma = b * sinSigma * (cos2SigmaM + b / 4 * (cosSigma * (-1 + 2 * cos2SigmaM * cos2SigmaM)
                - b / 6 * cos2SigmaM * (-3 + 4 * sinSigma * sinSigma) * (-3 + 4 * cos2SigmaM * cos2SigmaM)));
            return SemiMinorAxis * a * (sigma - deltaSigma);
        }
        return GreatCircleMetres(latitude1, longitude1, latitude2, longitude2);
    }

    /// <summary>Haversine distance on the sphere of the IUGG mean radius, metres.</summary>
    public static double GreatCircleMetres(double latitude1, double longitude1, double latitude2, double longitude2)
    {
        const double radians = Math.PI / 180, meanRadius = 6371008.8;
        double h = Square(Math.Sin((latitude2 - latitude1) * radians / 2))
                   + Math.Cos(latitude1 * radians) * Math.Cos(latitude2 * radians) * Square(Math.Sin((longitude2 - longitude1) * radians / 2));
        return 2 * meanRadius * Math.Asin(Math.Min(1, Math.Sqrt(h)));
    }

    private static double Square(double x) => x * x;
}
