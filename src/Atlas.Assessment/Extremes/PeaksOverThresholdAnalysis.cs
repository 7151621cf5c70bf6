using Atlas.Statistics;

namespace Atlas.Assessment.Extremes;

/// <summary>Extreme values from peaks over a threshold.</summary>
public static class PeaksOverThresholdAnalysis
{
    /// <summary>Chooses the threshold, declusters, fits the GPD to the peaks and reports return levels.</summary>
    /// <exception cref="ArgumentException">The series has no non-missing values, or fewer than
    /// <see cref="GevMaximumLikelihood.MinimumSampleSize"/> storm peaks exceed the threshold.</exception>
    public static PeaksOverThresholdResult Run(RegularSeries series, PeaksOverThresholdOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(series);
        options ??= new PeaksOverThresholdOptions();
        double[] sorted = ExactQuantile.SortedWithoutNaN(series.Values);
        if (sorted.Length == 0)
            throw new ArgumentException("The series has no non-missing values.", nameof(series));
        ProbabilityArgument.Require(options.ThresholdQuantile, nameof(options));
        double quantile = options.Threshold.HasValue ? double.NaN : options.ThresholdQuantile;
        double threshold = options.Threshold ?? ExactQuantile.OfSorted(sorted, options.ThresholdQuantile);

        var peaks = RunsDeclustering.Decluster(series, threshold, options.SeparationHours);
        if (peaks.Count < GevMaximumLikelihood.MinimumSampleSize)
            throw new ArgumentException(
                $"Only {peaks.Count} storm peaks exceed the threshold {threshold:0.###}; a fit needs {GevMaximumLikelihood.MinimumSampleSize}. Lower the threshold.",
                nameof(options));

        double recordYears = sorted.Length * series.StepHours / CalendarHours.PerMeanYear;
        double rate = peaks.Count / recordYears;
        var fit = GpdMaximumLikelihood.Fit([.. peaks.Select(p => p.PeakValue)], threshold, rate);
        var levels = fit.ReturnLevels(options.ReturnPeriodsYears, options.ConfidenceLevel);
        var cautions = ExtremeCaution.Assess(
            $"generalised Pareto fit to {peaks.Count} storm peaks over {threshold:0.###} ({options.SeparationHours:0.#} h runs declustering)",
            recordYears, peaks.Count, ExtremeCaution.SmallPeakSample, levels);
        return new PeaksOverThresholdResult(threshold, quantile, options.SeparationHours, peaks, recordYears, rate, fit, levels, fit.ProbabilityPlot(), cautions);
    }
}
