namespace Atlas.Assessment.Extremes;

/// <summary>A GPD fit to declustered storm peaks, its return levels, diagnostics and cautions.</summary>
/// <param name="Threshold">The threshold used.</param>
/// <param name="ThresholdQuantile">The quantile it came from, or NaN when given explicitly.</param>
/// <param name="SeparationHours">Declustering separation used.</param>
/// <param name="Peaks">The storm peaks, in time order.</param>
/// <param name="RecordYears">Non-missing time of the series, in mean years of 8766 h.</param>
/// <param name="ExceedancesPerYear">λ = peaks / record years.</param>
/// <param name="Fit">The GPD fit.</param>
/// <param name="ReturnLevels">Return levels, in the order requested.</param>
/// <param name="Diagnostics">Probability-plot points of the fit.</param>
/// <param name="Cautions">Always at least the general caution; see <see cref="ExtremeCaution"/>.</param>
public sealed record PeaksOverThresholdResult(
    double Threshold,
    double ThresholdQuantile,
    double SeparationHours,
    IReadOnlyList<StormPeak> Peaks,
    double RecordYears,
    double ExceedancesPerYear,
    GpdFit Fit,
    IReadOnlyList<ReturnLevel> ReturnLevels,
    IReadOnlyList<ProbabilityPlotPoint> Diagnostics,
    IReadOnlyList<ExtremeCaution> Cautions);
