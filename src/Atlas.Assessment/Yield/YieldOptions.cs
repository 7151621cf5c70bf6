namespace Atlas.Assessment.Yield;

/// <summary>Choices for a production estimate from a series.</summary>
public sealed record YieldOptions
{
    /// <summary>How to read the matrix; default bilinear.</summary>
    public PowerMatrixInterpolation Interpolation { get; init; } = PowerMatrixInterpolation.Bilinear;

    /// <summary>Coverage a calendar year needs to count as complete; default 0.9 (common practice).</summary>
    public double MinimumYearCoverage { get; init; } = 0.9;
}
