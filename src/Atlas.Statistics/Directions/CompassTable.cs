namespace Atlas.Statistics.Directions;

/// <summary>
/// Cosine, sine and 16-sector rose index of a direction in degrees, fast enough for every step of a layer pass:
/// a table per whole degree corrected by the angle-addition formulas with short Taylor series for the remainder
/// (under one degree), accurate to 2e-11.
/// </summary>
internal static class CompassTable
{
    private const double RadiansPerDegree = Math.PI / 180;
    private static readonly double[] Cos = BuildTable(Math.Cos);
    private static readonly double[] Sin = BuildTable(Math.Sin);

    /// <summary>cos and sin of the direction, and its sector of <see cref="DirectionStatistics.Sectors"/> (0 centred on north).</summary>
    /// <param name="degrees">A finite direction, degrees (any turn).</param>
    /// <param name="cos">Its cosine.</param>
    /// <param name="sin">Its sine.</param>
    /// <param name="sector">Its rose sector, 0..15, 0 centred on north, clockwise.</param>
    public static void Lookup(double degrees, out double cos, out double sin, out int sector)
    {
        double d = degrees - 360.0 * Math.Floor(degrees * (1 / 360.0));
        if (d >= 360.0) d -= 360.0;
        int whole = (int)d;
        double f = (d - whole) * RadiansPerDegree;
        double f2 = f * f;
        double cosF = 1 - f2 * (0.5 - f2 * (1 / 24.0));
        double sinF = f * (1 - f2 * (1 / 6.0 - f2 * (1 / 120.0)));
        double c = Cos[whole], s = Sin[whole];
        cos = c * cosF - s * sinF;
        sin = s * cosF + c * sinF;
        sector = (int)((d + DirectionStatistics.SectorWidthDegrees / 2) * (1 / DirectionStatistics.SectorWidthDegrees)) & (DirectionStatistics.Sectors - 1);
    }

    private static double[] BuildTable(Func<double, double> function)
    {
        var table = new double[361];
        for (int i = 0; i <= 360; i++) table[i] = function(i * RadiansPerDegree);
        return table;
    }
}
