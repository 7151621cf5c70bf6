namespace Atlas.Assessment;

/// <summary>Arithmetic on directions in degrees, on the circle.</summary>
public static class CircularDegrees
{
    /// <summary>The direction in [0, 360). NaN stays NaN.</summary>
    public static double Normalise(double degrees)
    {
        double wrapped = degrees % 360.0;
        if (wrapped < 0)
            wrapped += 360.0;
        // -1e-15 % 360 + 360 rounds to 360 itself.
        return wrapped >= 360.0 ? 0.0 : wrapped;
    }

    /// <summary>
    /// The signed smallest angle from <paramref name="fromDegrees"/> to <paramref name="toDegrees"/>,
    /// in (-180, 180]: positive when <paramref name="toDegrees"/> lies clockwise of
    /// <paramref name="fromDegrees"/>. Half a turn is reported as +180.
    /// </summary>
    public static double SignedDifference(double fromDegrees, double toDegrees)
    {
        double difference = Normalise(toDegrees - fromDegrees);
        return difference > 180.0 ? difference - 360.0 : difference;
    }

    /// <summary>
    /// Interpolates along the shorter arc: <paramref name="weight"/> 0 gives <paramref name="a"/>,
    /// 1 gives <paramref name="b"/>. Result in [0, 360).
    /// </summary>
    public static double Interpolate(double a, double b, double weight) =>
        Normalise(a + weight * SignedDifference(a, b));
}
