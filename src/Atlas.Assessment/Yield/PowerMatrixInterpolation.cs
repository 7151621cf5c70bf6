namespace Atlas.Assessment.Yield;

/// <summary>How a power matrix is read between its bin centres.</summary>
public enum PowerMatrixInterpolation
{
    /// <summary>
    /// Bilinear interpolation between the four surrounding bin centres. In the outer half bins (between
    /// an outer centre and the matrix edge) the outer centre's value is held, never extrapolated.
    /// </summary>
    Bilinear,
    /// <summary>The value of the bin that contains the sea state (a value on a bin edge belongs to the upper bin).</summary>
    NearestBin,
}
