namespace Atlas.Assessment.Extremes;

/// <summary>Gumbel and GEV fits to annual maxima, their return levels, diagnostics and cautions.</summary>
/// <param name="Sample">The annual maxima and the years left out.</param>
/// <param name="Gumbel">Two-parameter fit (ξ = 0).</param>
/// <param name="Gev">Three-parameter fit.</param>
/// <param name="GumbelReturnLevels">Return levels of the Gumbel fit, in the order requested.</param>
/// <param name="GevReturnLevels">Return levels of the GEV fit, in the order requested.</param>
/// <param name="GumbelDiagnostics">Probability-plot points of the Gumbel fit.</param>
/// <param name="GevDiagnostics">Probability-plot points of the GEV fit.</param>
/// <param name="Cautions">Always at least the general caution; see <see cref="ExtremeCaution"/>.</param>
public sealed record AnnualMaximaResult(
    AnnualMaximaSample Sample,
    GevFit Gumbel,
    GevFit Gev,
    IReadOnlyList<ReturnLevel> GumbelReturnLevels,
    IReadOnlyList<ReturnLevel> GevReturnLevels,
    IReadOnlyList<ProbabilityPlotPoint> GumbelDiagnostics,
    IReadOnlyList<ProbabilityPlotPoint> GevDiagnostics,
    IReadOnlyList<ExtremeCaution> Cautions);
