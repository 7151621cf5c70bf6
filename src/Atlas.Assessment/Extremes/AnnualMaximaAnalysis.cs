namespace Atlas.Assessment.Extremes;

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
        var gumbelLevels = gumbel.ReturnLevels(options.ReturnPeriodsYears, options.ConfidenceLevel);
        var gevLevels = gev.ReturnLevels(options.ReturnPeriodsYears, options.ConfidenceLevel);
        var cautions = ExtremeCaution.Assess(
            "Gumbel and GEV fit to annual maxima", values.Length, values.Length, ExtremeCaution.SmallAnnualMaximaSample,
            gevLevels.Concat(gumbelLevels).DistinctBy(l => l.ReturnPeriodYears));
        return new AnnualMaximaResult(sample, gumbel, gev, gumbelLevels, gevLevels, gumbel.ProbabilityPlot(), gev.ProbabilityPlot(), cautions);
    }
}
