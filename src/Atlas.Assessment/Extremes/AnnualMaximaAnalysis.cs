namespace Atlas.Assessment.Extremes;

/// <summary>Choices for an annual-maxima analysis.</summary>
public sealed record AnnualMaximaOptions
{
    /// <summary>Share of a year that must be non-missing; default <see cref="AnnualMaxima.DefaultMinimumCoverage"/>.</summary>
    public double MinimumCoverage { get; init; } = AnnualMaxima.DefaultMinimumCoverage;

    /// <summary>Return periods to report, years. Default 1, 5, 10, 50, 100 (the 1-year level comes back undefined, with a note).</summary>
    public IReadOnlyList<double> ReturnPeriodsYears { get; init; } = [1, 5, 10, 50, 100];

    /// <summary>Coverage of the profile-likelihood intervals; default 0.95.</summary>
    public double ConfidenceLevel { get; init; } = 0.95;
}

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

/// <summary>Extreme values from annual maxima.</summary>
public static class AnnualMaximaAnalysis
{
    /// <summary>Extracts the annual maxima of a series and fits them.</summary>
    /// <exception cref="ArgumentException">Fewer than <see cref="GevMaximumLikelihood.MinimumSampleSize"/> years have enough coverage.</exception>
    public static AnnualMaximaResult Run(RegularSeries series, AnnualMaximaOptions? options = null)
    {
        options ??= new AnnualMaximaOptions();
        var sample = AnnualMaxima.Extract(series, options.MinimumCoverage);
        if (sample.Maxima.Count < GevMaximumLikelihood.MinimumSampleSize)
            throw new ArgumentException(
                $"Only {sample.Maxima.Count} calendar years have at least {options.MinimumCoverage:P0} coverage; " +
                $"an annual-maxima fit needs {GevMaximumLikelihood.MinimumSampleSize}. Use peaks over threshold for a short record.",
                nameof(series));
        return Run(sample, options);
    }

    /// <summary>Fits annual maxima already extracted.</summary>
    /// <exception cref="ArgumentException">Fewer than <see cref="GevMaximumLikelihood.MinimumSampleSize"/> maxima.</exception>
    public static AnnualMaximaResult Run(AnnualMaximaSample sample, AnnualMaximaOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(sample);
        options ??= new AnnualMaximaOptions();
        double[] values = sample.Values();
        var gumbel = GevMaximumLikelihood.FitGumbel(values);
        var gev = GevMaximumLikelihood.FitGev(values);
        var gumbelLevels = options.ReturnPeriodsYears.Select(t => gumbel.ReturnLevel(t, options.ConfidenceLevel)).ToArray();
        var gevLevels = options.ReturnPeriodsYears.Select(t => gev.ReturnLevel(t, options.ConfidenceLevel)).ToArray();
        var cautions = ExtremeCaution.Assess(
            "Gumbel and GEV fit to annual maxima", values.Length, values.Length, ExtremeCaution.SmallAnnualMaximaSample,
            gevLevels.Concat(gumbelLevels).DistinctBy(l => l.ReturnPeriodYears));
        return new AnnualMaximaResult(sample, gumbel, gev, gumbelLevels, gevLevels, gumbel.ProbabilityPlot(), gev.ProbabilityPlot(), cautions);
    }
}
