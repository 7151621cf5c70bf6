using Atlas.Statistics;

namespace Atlas.Assessment.Extremes;

/// <summary>Choices for a peaks-over-threshold analysis.</summary>
public sealed record PeaksOverThresholdOptions : ReturnLevelOptions
{
    /// <summary>
    /// Threshold as a quantile of the non-missing values (Hyndman-Fan type 7, see <see cref="ExactQuantile"/>);
    /// default 0.99 (common practice for hourly wave records). Ignored when <see cref="Threshold"/> is set.
    /// </summary>
    public double ThresholdQuantile { get; init; } = 0.99;

    /// <summary>An explicit threshold in the series' units; null to use <see cref="ThresholdQuantile"/>.</summary>
    public double? Threshold { get; init; }

    /// <summary>Declustering separation, hours; default <see cref="RunsDeclustering.DefaultSeparationHours"/>.</summary>
    public double SeparationHours { get; init; } = RunsDeclustering.DefaultSeparationHours;
}
