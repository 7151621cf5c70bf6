namespace Atlas.Assessment.Extremes;

/// <summary>A generalised Pareto distribution fitted to storm peaks over a threshold, with the rate of peaks.</summary>
/// <remarks>
/// The T-year return level is x = u + σ ((λT)^ξ - 1)/ξ (u + σ ln(λT) at ξ = 0; Coles 2001, §4.3.3); its profile
/// likelihood runs over (σ, ξ), and the uncertainty of λ is not included (Coles shows it is small beside that of ξ).
/// The level is defined only when λT &gt; 1: with fewer than one peak per T years on average it lies at or below the
/// threshold, where the GPD does not describe the data. It is then NaN with a note (lower the threshold to estimate it).
/// </remarks>
public sealed class GpdFit : ExtremeValueFit
{
    private readonly double[] _excesses;

    internal GpdFit(double[] sortedPeaks, double threshold, double exceedancesPerYear, GeneralizedParetoDistribution distribution, double logLikelihood)
        : base(sortedPeaks, logLikelihood)
    {
        _excesses = [.. sortedPeaks.Select(x => x - threshold)];
        Threshold = threshold;
        ExceedancesPerYear = exceedancesPerYear;
        Distribution = distribution;
    }

    /// <summary>The threshold u.</summary>
    public double Threshold { get; }

    /// <summary>λ, mean number of peaks (clusters) above the threshold per year.</summary>
    public double ExceedancesPerYear { get; }

    /// <summary>The fitted distribution of excesses over the threshold.</summary>
    public GeneralizedParetoDistribution Distribution { get; }

    /// <summary>The peaks fitted, ascending.</summary>
    public IReadOnlyList<double> Peaks => SortedSample;

    /// <summary>Record length implied by the peaks and their rate, years.</summary>
    public override double RecordYears => SortedSample.Length / ExceedancesPerYear;

    private protected override double FittedScale => Distribution.Scale;

    private protected override double LowestLevel => Threshold;

    /// <summary>Below ~1e-9 the reparametrised scale σ = (x - u)/ln(λT) degenerates.</summary>
    private protected override string? WhyUndefined(double returnPeriodYears) => LogPeaks(returnPeriodYears) <= 1e-9
        ? $"Undefined at this threshold: {ExceedancesPerYear:0.##} peaks a year give λT = {ExceedancesPerYear * returnPeriodYears:0.##} ≤ 1, " +
          "so the level lies at or below the threshold, outside the fitted tail. Lower the threshold to estimate it."
        : null;

    private protected override double LevelAt(double returnPeriodYears) =>
        Threshold + ReducedLevel(Distribution.Scale, Distribution.Shape, LogPeaks(returnPeriodYears));

    private protected override double FittedProbability(double value) => Distribution.Cdf(value - Threshold);

    private protected override double FittedQuantile(double probability) => Threshold + Distribution.Quantile(probability);

    /// <summary>ln(λT), the log of the expected number of peaks in T years.</summary>
    private double LogPeaks(double returnPeriodYears) => Math.Log(ExceedancesPerYear * returnPeriodYears);

    /// <summary>σ ((λT)^ξ - 1)/ξ with ln(λT) given.</summary>
    private static double ReducedLevel(double scale, double shape, double logPeaks) =>
        Math.Abs(shape) < GevDistribution.GumbelShapeTolerance
            ? scale * logPeaks
            : scale * GevDistribution.ReducedQuantileTerm(shape, -logPeaks);

    /// <summary>Profile log-likelihood of the level x: σ = (x - u) ξ / ((λT)^ξ - 1), maximised over ξ.</summary>
    private protected override Func<double, double> ProfileAt(double returnPeriodYears)
    {
        double[] excesses = _excesses;
        double threshold = Threshold;
        double logPeaks = LogPeaks(returnPeriodYears);
        var profile = new WarmStartedProfile([Distribution.Shape], [0.1], restartAtZeroShape: true);
        return x => profile.Maximum(p =>
        {
            if (p[0] <= -1) return double.PositiveInfinity;
            double scale = (x - threshold) / ReducedLevel(1.0, p[0], logPeaks);
            return -GeneralizedParetoDistribution.LogLikelihood(excesses, scale, p[0]);
        });
    }
}
