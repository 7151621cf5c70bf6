namespace Atlas.Assessment.Extremes;

/// <summary>
/// A distribution fitted by maximum likelihood to extremes (annual maxima or storm peaks), with the values it was fitted
/// to: return levels with profile-likelihood confidence intervals, and probability-plot diagnostics.
/// </summary>
/// <remarks>
/// The two fits differ in what a return level is and when it is undefined (see <see cref="GevFit"/> and
/// <see cref="GpdFit"/>); the checks, the interval search and the diagnostics are the same for both.
/// </remarks>
public abstract class ExtremeValueFit
{
    private readonly double[] _sortedSample;

    private protected ExtremeValueFit(double[] sortedSample, double logLikelihood)
    {
        _sortedSample = sortedSample;
        LogLikelihood = logLikelihood;
    }

    /// <summary>Maximised log-likelihood.</summary>
    public double LogLikelihood { get; }

    /// <summary>Length of the record the fit stands for, years; return periods beyond a few of it are marked as long extrapolations.</summary>
    public abstract double RecordYears { get; }

    /// <summary>The values fitted, ascending.</summary>
    private protected double[] SortedSample => _sortedSample;

    /// <summary>
    /// The T-year return level, exceeded on average once every T years, with a profile-likelihood confidence interval
    /// (Coles 2001, §2.6.6 and §3.3.3: the likelihood reparametrised by the return level, the other parameters
    /// maximised out, bounds where the deviance reaches χ²₁(level)). Where a fit cannot define the level it is NaN
    /// with a note; return periods beyond <see cref="ExtremeCaution.LongExtrapolationRatio"/> record lengths are marked.
    /// </summary>
    /// <exception cref="ArgumentOutOfRangeException">T is not a positive finite number, or the level is outside (0, 1).</exception>
    public ReturnLevel ReturnLevel(double returnPeriodYears, double confidenceLevel = 0.95)
    {
        if (!double.IsFinite(returnPeriodYears) || returnPeriodYears <= 0)
            throw new ArgumentOutOfRangeException(nameof(returnPeriodYears), returnPeriodYears, "A return period is a positive number of years.");
        if (!(confidenceLevel > 0 && confidenceLevel < 1))
            throw new ArgumentOutOfRangeException(nameof(confidenceLevel), confidenceLevel, "A confidence level lies strictly between 0 and 1.");
        bool longExtrapolation = ExtremeCaution.IsLongExtrapolation(returnPeriodYears, RecordYears);
        if (WhyUndefined(returnPeriodYears) is { } reason)
            return new ReturnLevel(returnPeriodYears, double.NaN, double.NaN, double.NaN, confidenceLevel, longExtrapolation, reason);

        double level = LevelAt(returnPeriodYears);
        var (lower, upper) = ProfileLikelihoodInterval.Find(
            ProfileAt(returnPeriodYears), level, LogLikelihood, confidenceLevel, 0.2 * FittedScale, LowestLevel);
        return new ReturnLevel(returnPeriodYears, level, lower, upper, confidenceLevel, longExtrapolation,
            ProfileLikelihoodInterval.Describe(lower, upper));
    }

    /// <summary>The return levels of several return periods, in the order given (see <see cref="ReturnLevel"/>).</summary>
    public IReadOnlyList<ReturnLevel> ReturnLevels(IEnumerable<double> returnPeriodsYears, double confidenceLevel = 0.95) =>
        [.. returnPeriodsYears.Select(t => ReturnLevel(t, confidenceLevel))];

    /// <summary>
    /// Fit diagnostics: each value fitted against its plotting position and the fitted distribution (for peaks over a
    /// threshold, conditional on exceeding it).
    /// </summary>
    public IReadOnlyList<ProbabilityPlotPoint> ProbabilityPlot()
    {
        int n = _sortedSample.Length;
        return [.. _sortedSample.Select((x, i) =>
        {
            double empirical = (i + 1.0) / (n + 1.0);
            return new ProbabilityPlotPoint(x, empirical, FittedProbability(x), FittedQuantile(empirical));
        })];
    }

    /// <summary>Why the fit cannot give the T-year level (the note returned with it), or null when it can.</summary>
    private protected abstract string? WhyUndefined(double returnPeriodYears);

    /// <summary>The maximum-likelihood estimate of the T-year level, where it is defined.</summary>
    private protected abstract double LevelAt(double returnPeriodYears);

    /// <summary>The profile log-likelihood of the T-year level: a function of the level, -∞ where it is impossible.</summary>
    private protected abstract Func<double, double> ProfileAt(double returnPeriodYears);

    /// <summary>The fitted scale σ; the interval search starts 0.2 σ from the estimate.</summary>
    private protected abstract double FittedScale { get; }

    /// <summary>Levels at or below this are impossible (−∞ for none).</summary>
    private protected abstract double LowestLevel { get; }

    /// <summary>The fitted non-exceedance probability of a value.</summary>
    private protected abstract double FittedProbability(double value);

    /// <summary>The fitted value with the given non-exceedance probability.</summary>
    private protected abstract double FittedQuantile(double probability);
}
