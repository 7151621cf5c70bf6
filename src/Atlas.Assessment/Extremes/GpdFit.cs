namespace Atlas.Assessment.Extremes;

/// <summary>A generalised Pareto distribution fitted to storm peaks over a threshold, with the rate of peaks.</summary>
public sealed class GpdFit
{
    private readonly double[] _sortedPeaks;
    private readonly double[] _excesses;

    internal GpdFit(double[] sortedPeaks, double threshold, double exceedancesPerYear, GeneralizedParetoDistribution distribution, double logLikelihood)
    {
        _sortedPeaks = sortedPeaks;
        _excesses = [.. sortedPeaks.Select(x => x - threshold)];
        Threshold = threshold;
        ExceedancesPerYear = exceedancesPerYear;
        Distribution = distribution;
        LogLikelihood = logLikelihood;
    }

    /// <summary>The threshold u.</summary>
    public double Threshold { get; }

    /// <summary>λ, mean number of peaks (clusters) above the threshold per year.</summary>
    public double ExceedancesPerYear { get; }

    /// <summary>The fitted distribution of excesses over the threshold.</summary>
    public GeneralizedParetoDistribution Distribution { get; }

    /// <summary>Maximised log-likelihood of the excesses.</summary>
    public double LogLikelihood { get; }

    /// <summary>The peaks fitted, ascending.</summary>
    public IReadOnlyList<double> Peaks => _sortedPeaks;

    /// <summary>Record length implied by the peaks and their rate, years.</summary>
    public double RecordYears => _sortedPeaks.Length / ExceedancesPerYear;

    /// <summary>
    /// The T-year return level, exceeded on average once every T years: x = u + σ ((λT)^ξ - 1)/ξ
    /// (u + σ ln(λT) at ξ = 0; Coles 2001, §4.3.3), with a profile-likelihood confidence interval
    /// over (σ, ξ). The uncertainty of λ is not included (Coles shows it is small beside that of ξ).
    /// </summary>
    /// <remarks>
    /// Defined only when λT &gt; 1: with fewer than one peak per T years on average the level lies
    /// at or below the threshold, where the GPD does not describe the data. It is then NaN with a
    /// note (lower the threshold to estimate it).
    /// </remarks>
    /// <exception cref="ArgumentOutOfRangeException">T is not a positive finite number, or the level is outside (0, 1).</exception>
    public ReturnLevel ReturnLevel(double returnPeriodYears, double confidenceLevel = 0.95)
    {
        if (!double.IsFinite(returnPeriodYears) || returnPeriodYears <= 0)
            throw new ArgumentOutOfRangeException(nameof(returnPeriodYears), returnPeriodYears, "A return period is a positive number of years.");
        if (!(confidenceLevel > 0 && confidenceLevel < 1))
            throw new ArgumentOutOfRangeException(nameof(confidenceLevel), confidenceLevel, "A confidence level lies strictly between 0 and 1.");
        bool longExtrapolation = ExtremeCaution.IsLongExtrapolation(returnPeriodYears, RecordYears);
        double logPeaks = Math.Log(ExceedancesPerYear * returnPeriodYears);
        // Below ~1e-9 the reparametrised scale σ = (x - u)/ln(λT) degenerates.
        if (logPeaks <= 1e-9)
            return new ReturnLevel(returnPeriodYears, double.NaN, double.NaN, double.NaN, confidenceLevel, longExtrapolation,
                $"Undefined at this threshold: {ExceedancesPerYear:0.##} peaks a year give λT = {ExceedancesPerYear * returnPeriodYears:0.##} ≤ 1, " +
                "so the level lies at or below the threshold, outside the fitted tail. Lower the threshold to estimate it.");

        double level = Threshold + ReducedLevel(Distribution.Scale, Distribution.Shape, logPeaks);
        var (lower, upper) = ProfileLikelihoodInterval.Find(
            ProfileAt(logPeaks), level, LogLikelihood, confidenceLevel, 0.2 * Distribution.Scale, Threshold);
        string? note = ProfileLikelihoodInterval.Describe(lower, upper);
        return new ReturnLevel(returnPeriodYears, level, lower, upper, confidenceLevel, longExtrapolation, note);
    }

    /// <summary>Fit diagnostics: each peak against its plotting position and the fitted distribution (conditional on exceeding u).</summary>
    public IReadOnlyList<ProbabilityPlotPoint> ProbabilityPlot()
    {
        int n = _sortedPeaks.Length;
        return [.. _sortedPeaks.Select((x, i) =>
        {
            double empirical = (i + 1.0) / (n + 1.0);
            return new ProbabilityPlotPoint(x, empirical, Distribution.Cdf(x - Threshold), Threshold + Distribution.Quantile(empirical));
        })];
    }

    /// <summary>σ ((λT)^ξ - 1)/ξ with ln(λT) given.</summary>
    private static double ReducedLevel(double scale, double shape, double logPeaks) =>
        Math.Abs(shape) < GevDistribution.GumbelShapeTolerance
            ? scale * logPeaks
            : scale * GevDistribution.ReducedQuantileTerm(shape, -logPeaks);

    /// <summary>
    /// Profile log-likelihood of the level x: σ = (x - u) ξ / ((λT)^ξ - 1), maximised over ξ,
    /// starting from the previous solution or, if that is impossible at the new x, from ξ = 0.
    /// </summary>
    private Func<double, double> ProfileAt(double logPeaks)
    {
        double[] excesses = _excesses;
        double threshold = Threshold;
        double[] previous = [Distribution.Shape];
        return x =>
        {
            double Objective(double[] p)
            {
                if (p[0] <= -1) return double.PositiveInfinity;
                double scale = (x - threshold) / ReducedLevel(1.0, p[0], logPeaks);
                return -GeneralizedParetoDistribution.LogLikelihood(excesses, scale, p[0]);
            }
            double[] start = double.IsFinite(Objective(previous)) ? previous : [0.0];
            if (!double.IsFinite(Objective(start)))
                return double.NegativeInfinity;
            var (point, value) = NelderMeadMinimiser.Minimise(Objective, start, [0.1]);
            previous = point;
            return -value;
        };
    }
}
