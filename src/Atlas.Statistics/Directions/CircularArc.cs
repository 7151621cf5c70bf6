namespace Atlas.Statistics.Directions;

/// <summary>
/// Arithmetic between two directions in degrees along the shorter arc of the circle: the signed difference a skill
/// score takes, and the interpolation a time matcher needs between two steps.
/// </summary>
public static class CircularArc
{
    /// <summary>
    /// The signed smallest angle from <paramref name="fromDegrees"/> to <paramref name="toDegrees"/>, in (-180, 180]:
    /// positive when <paramref name="toDegrees"/> lies clockwise of <paramref name="fromDegrees"/>. Half a turn is
    /// reported as +180. NaN when either direction is NaN.
    /// </summary>
    public static double SignedDifference(double fromDegrees, double toDegrees)
    {
        double difference = CircularStatistics.Normalise(toDegrees - fromDegrees);
        return difference > 180.0 ? difference - 360.0 : difference;
    }

    /// <summary>
    /// Interpolates along the shorter arc: <paramref name="weight"/> 0 gives <paramref name="a"/>, 1 gives
    /// <paramref name="b"/>. Result in [0, 360); half a turn apart, the arc taken is the clockwise one.
    /// </summary>
    public static double Interpolate(double a, double b, double weight) =>
        CircularStatistics.Normalise(a + weight * SignedDifference(a, b));
}
