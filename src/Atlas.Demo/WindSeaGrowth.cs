namespace Atlas.Demo;

/// <summary>
/// Local wind sea from wind speed and fetch: the fetch-limited JONSWAP growth laws
/// g Hm0 / U^2 = 1.6e-3 (g F / U^2)^(1/2) and g Tp / U = 0.286 (g F / U^2)^(1/3) (Hasselmann et al.
/// 1973), capped at the Pierson-Moskowitz fully developed sea g Hm0 / U^2 = 0.21 and
/// omega_p U / g = 0.877 (all from memory). Young, fetch-limited seas are peaked (Te / Tp = 0.9,
/// JONSWAP) and broad in direction; fully developed ones tend to the Pierson-Moskowitz
/// Te / Tp = 0.857 and narrow a little.
/// </summary>
public static class WindSeaGrowth
{
    private const double G = ShoalingTable.Gravity;
    private const double CubeRootThousand = 10.0;
    private static readonly double GravityToMinusTwoThirds = Math.Pow(G, -2.0 / 3.0);

    /// <summary>Winds below this speed (m/s) raise no sea.</summary>
    public const double CalmMetresPerSecond = 0.5;

    /// <summary>
    /// Hs (m), Tp (s), Te (s) and spread (degrees) of the sea raised by a wind of
    /// <paramref name="windMetresPerSecond"/> over <paramref name="fetchKm"/> of water. Zero height
    /// (and periods of zero) in a calm or with no fetch.
    /// </summary>
    public static (double Hs, double Tp, double Te, double SpreadDegrees) Grow(double windMetresPerSecond, double fetchKm) =>
        Grow(windMetresPerSecond, Math.Cbrt(windMetresPerSecond), fetchKm, Math.Cbrt(fetchKm));

    /// <summary>
    /// <see cref="Grow(double, double)"/> with the cube roots of wind and fetch supplied, for
    /// callers that tabulate them (the cube root dominates the cost otherwise).
    /// </summary>
    public static (double Hs, double Tp, double Te, double SpreadDegrees) Grow(double windMetresPerSecond, double cubeRootWind, double fetchKm, double cubeRootFetchKm)
    {
        if (windMetresPerSecond < CalmMetresPerSecond || fetchKm <= 0) return (0, 0, 0, 0);
        double u2 = windMetresPerSecond * windMetresPerSecond;
        // 1.6e-3 (gF/U^2)^(1/2) U^2/g = 1.6e-3 U sqrt(F/g); 0.286 (gF/U^2)^(1/3) U/g = 0.286 (F U)^(1/3) g^(-2/3).
        double fetchHeight = 1.6e-3 * windMetresPerSecond * Math.Sqrt(fetchKm * 1000.0 / G);
        double fetchPeriod = 0.286 * cubeRootWind * cubeRootFetchKm * CubeRootThousand * GravityToMinusTwoThirds;
        double fullHeight = 0.21 * u2 / G;
        double fullPeriod = 2 * Math.PI * windMetresPerSecond / (0.877 * G);
        double height = Math.Min(fetchHeight, fullHeight);
        double period = Math.Min(fetchPeriod, fullPeriod);
        double development = height / fullHeight;
        double ratio = 0.9 - (0.9 - 0.857) * development;
        double spread = 38.0 - 8.0 * development;
        return (height, period, ratio * period, spread);
    }
}
