namespace Atlas.Hindcast;

/// <summary>
/// What an ingest reads from one source of a dataset, whatever the file holds: the wave fields of a block of steps and
/// points, decoded (SI units, directions "from", NaN for missing), and the water depth of every point.
/// </summary>
public interface IStepReader : IDisposable
{
    /// <summary>
    /// Reads steps [<paramref name="timeStart"/>, +<paramref name="timeCount"/>) of points [<paramref name="pointStart"/>,
    /// +<paramref name="pointCount"/>) of <paramref name="variable"/> into <paramref name="destination"/>, laid out [time][point].
    /// </summary>
    void ReadSteps(WaveParameter variable, int timeStart, int timeCount, int pointStart, int pointCount, Span<float> destination);

    /// <summary>The water depth of every point, as decoded (signs kept).</summary>
    DepthField ReadDepthField();
}
