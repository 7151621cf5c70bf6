namespace Atlas.Assessment.Extremes;

/// <summary>Choices for an annual-maxima analysis.</summary>
public sealed record AnnualMaximaOptions : ReturnLevelOptions
{
    /// <summary>Share of a year that must be non-missing; default <see cref="AnnualMaxima.DefaultMinimumCoverage"/>.</summary>
    public double MinimumCoverage { get; init; } = AnnualMaxima.DefaultMinimumCoverage;
}
