namespace Atlas.Demo;

/// <summary>
/// For each wet cell and each of <see cref="SectorCount"/> directions, the distance over water
/// (km) towards that direction before land is met: the fetch for a wind from that direction, and
/// the basis of sheltering for waves coming from it. A ray that reaches the open ocean gets
/// <see cref="OpenOceanKm"/>.
/// </summary>
public sealed class FetchRays
{
    /// <summary>Number of direction sectors; sector s is centred on s * 360 / SectorCount degrees (coming from).</summary>
    public const int SectorCount = 72;

    /// <summary>Sector width, degrees.</summary>
    public const double SectorDegrees = 360.0 / SectorCount;

    /// <summary>
    /// Distance standing for an unobstructed ocean fetch, km: long enough that open-ocean wind
    /// seas are limited by wind duration and full development rather than by fetch.
    /// </summary>
    public const double OpenOceanKm = 800.0;

    private const double MaximumMarchKm = 400.0;

    private readonly float[] _distanceKm;
    private readonly float[] _cubeRootDistance;

    /// <summary>Marches the rays of every wet cell of <paramref name="grid"/>.</summary>
    public FetchRays(DemoGrid grid)
    {
        int n = grid.WetCount;
        _distanceKm = new float[n * SectorCount];
        _cubeRootDistance = new float[n * SectorCount];
        Parallel.For(0, n, k =>
        {
            for (int s = 0; s < SectorCount; s++)
            {
                double d = March(grid.XKm[k], grid.YKm[k], s * SectorDegrees);
                _distanceKm[k * SectorCount + s] = (float)d;
                _cubeRootDistance[k * SectorCount + s] = (float)Math.Cbrt(d);
            }
        });
    }

    /// <summary>Distance to land of wet cell k in sector s, km.</summary>
    public double DistanceKm(int k, int sector) => _distanceKm[k * SectorCount + sector];

    /// <summary>
    /// Distance to land of wet cell k towards <paramref name="fromDegrees"/>, interpolated
    /// linearly between the neighbouring sectors.
    /// </summary>
    public double DistanceKm(int k, double fromDegrees) => Interpolate(_distanceKm, k, fromDegrees);

    /// <summary>Cube root of the distance (km) to land towards a direction, interpolated like <see cref="DistanceKm(int, double)"/>.</summary>
    public double CubeRootDistanceKm(int k, double fromDegrees) => Interpolate(_cubeRootDistance, k, fromDegrees);

    /// <summary>
    /// The two sectors either side of <paramref name="fromDegrees"/> (any angle, reduced modulo
    /// 360) and the interpolation weight of the second.
    /// </summary>
    public static double SectorsAround(double fromDegrees, out int first, out int second)
    {
        double position = fromDegrees * (1.0 / SectorDegrees);
        position -= SectorCount * Math.Floor(position * (1.0 / SectorCount));
        first = (int)position;
        if (first >= SectorCount) first = 0;
        second = first + 1 == SectorCount ? 0 : first + 1;
        return position - first;
    }

    private static double Interpolate(float[] table, int k, double fromDegrees)
    {
        double f = SectorsAround(fromDegrees, out int s0, out int s1);
        int row = k * SectorCount;
        return table[row + s0] + f * (table[row + s1] - table[row + s0]);
    }

    private static double March(double x, double y, double azimuthDegrees)
    {
        double a = azimuthDegrees * Math.PI / 180.0;
        double dx = Math.Sin(a), dy = Math.Cos(a);
        double travelled = 0;
        while (travelled < MaximumMarchKm)
        {
            // Fine steps near the cell resolve the headland and island; coarser ones further out.
            double step = travelled < 30 ? 0.5 : travelled < 100 ? 1.0 : 2.5;
            travelled += step;
            double px = x + travelled * dx, py = y + travelled * dy;
            if (px < CoastGeometry.WesternmostLandXKm && dx <= 0) return OpenOceanKm;
            if (CoastGeometry.IsLand(px, py)) return travelled;
        }
        return OpenOceanKm;
    }
}
