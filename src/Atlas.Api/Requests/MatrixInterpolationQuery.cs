namespace Atlas.Api.Requests;

/// <summary>How a power matrix is read between its bins: the interpolation query value and the note every answer states.</summary>
public static class MatrixInterpolationQuery
{
    /// <summary>How a matrix is read between its bins, stated in every device and yield response.</summary>
    public const string Note =
        "bilinear (default): power interpolated between the four surrounding bin centres, the outer centre's value held in the outer " +
        "half bins; nearest: the value of the bin holding the sea state (a value on a bin edge belongs to the upper bin). Bin edges lie " +
        "halfway between centres, the outer edges half a bin beyond the outer centres; sea states outside the matrix produce 0 kW and are counted.";

    /// <summary>interpolation: bilinear (the default) or nearest; a fault goes into <paramref name="errors"/>.</summary>
    public static PowerMatrixInterpolation Read(string? text, QueryErrors errors) =>
        errors.Choice("interpolation", text, "matrix interpolation", "bilinear", "nearest") == "nearest"
            ? PowerMatrixInterpolation.NearestBin
            : PowerMatrixInterpolation.Bilinear;

    public static string Name(PowerMatrixInterpolation interpolation) => interpolation == PowerMatrixInterpolation.Bilinear ? "bilinear" : "nearest";
}
