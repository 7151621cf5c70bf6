using Atlas.Statistics;

namespace Atlas.Assessment.Extremes;

/// <summary>Choices for a peaks-over-threshold analysis.</summary>
public sealed record PeaksOverThresholdOptions
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

    /// <summary>Return periods to report, years; default 1, 5, 10, 50, 100.</summary>
    public IReadOnlyList<double> ReturnPeriodsYears { get; init; } = [1, 5, 10, 50, 100];

    /// <summary>Coverage of the profile-likelihood intervals; default 0.95.</summary>
    public double ConfidenceLevel { get; init; } = 0.95;
}

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
        var levels = options.ReturnPeriodsYears.Select(t => fit.ReturnLevel(t, options.ConfidenceLevel)).ToArray();
        var cautions = ExtremeCaution.Assess(
            $"generalised Pareto fit to {peaks.Count} storm peaks over {threshold:0.###} ({options.SeparationHours:0.#} h runs declustering)",
            recordYears, peaks.Count, ExtremeCaution.SmallPeakSample, levels);
        return new PeaksOverThresholdResult(threshold, quantile, options.SeparationHours, peaks, recordYears, rate, fit, levels, fit.ProbabilityPlot(), cautions);
    }
}
