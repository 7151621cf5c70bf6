namespace Atlas.Assessment.Extremes;

/// <summary>The return levels an extreme-value analysis reports, whichever sample it fits.</summary>
public abstract record ReturnLevelOptions
{
    /// <summary>
    /// Return periods to report, years. Default 1, 5, 10, 50, 100 (from annual maxima the 1-year level comes back
    /// undefined, with a note).
    /// </summary>
    public IReadOnlyList<double> ReturnPeriodsYears { get; init; } = [1, 5, 10, 50, 100];

    /// <summary>Coverage of the profile-likelihood intervals; default 0.95.</summary>
    public double ConfidenceLevel { get; init; } = 0.95;
}
