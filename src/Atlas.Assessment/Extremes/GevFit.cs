namespace Atlas.Assessment.Extremes;

/// <summary>A GEV or Gumbel distribution fitted by maximum likelihood to annual maxima, with its sample.</summary>
/// <remarks>
/// The T-year return level is the quantile at 1 - 1/T. T = 1 year (or less) is undefined from annual maxima: every
/// year's maximum exceeds the level with probability 1 - 1/T = 0, so the level is -∞ (Gumbel) or the lower support
/// bound. It is returned as NaN with a note; estimate it from peaks over threshold instead. The record length is one
/// year per value.
/// </remarks>
public sealed class GevFit : ExtremeValueFit
{
    internal GevFit(double[] sortedSample, GevDistribution distribution, double logLikelihood, bool shapeFixedAtZero)
        : base(sortedSample, logLikelihood)
    {
        Distribution = distribution;
        ShapeFixedAtZero = shapeFixedAtZero;
    }

    /// <summary>The fitted distribution.</summary>
    public GevDistribution Distribution { get; }

    /// <summary>True for a Gumbel fit (ξ held at 0); false for the three-parameter GEV.</summary>
    public bool ShapeFixedAtZero { get; }

    /// <summary>The fitted values, ascending.</summary>
    public IReadOnlyList<double> Sample => SortedSample;

    /// <summary>One year per annual maximum.</summary>
    public override double RecordYears => SortedSample.Length;

    private protected override double FittedScale => Distribution.Scale;

    private protected override double LowestLevel => double.NegativeInfinity;

    private protected override string? WhyUndefined(double returnPeriodYears) => returnPeriodYears <= 1
        ? "Undefined from annual maxima: a level with a return period of one year or less is exceeded by every " +
          "annual maximum (non-exceedance probability 1 - 1/T ≤ 0). Use the peaks-over-threshold estimate."
        : null;

    private protected override double LevelAt(double returnPeriodYears) => Distribution.AnnualReturnLevel(returnPeriodYears);

    private protected override double FittedProbability(double value) => Distribution.Cdf(value);

    private protected override double FittedQuantile(double probability) => Distribution.Quantile(probability);

    /// <summary>
    /// Profile log-likelihood of the return level z with reduced variate log y = log(-log(1 - 1/T)):
    /// μ = z - σ (y^(-ξ) - 1)/ξ, maximised over σ (and ξ unless it is held at 0).
    /// </summary>
    private protected override Func<double, double> ProfileAt(double returnPeriodYears)
    {
        double[] sample = SortedSample;
        double logY = Math.Log(-Math.Log(1 - 1 / returnPeriodYears));
        if (ShapeFixedAtZero)
        {
            var gumbel = new WarmStartedProfile([Math.Log(Distribution.Scale)], [0.1], restartAtZeroShape: false);
            return z => gumbel.Maximum(p => -GevDistribution.LogLikelihood(sample, z + Math.Exp(p[0]) * logY, Math.Exp(p[0]), 0));
        }

        var gev = new WarmStartedProfile([Math.Log(Distribution.Scale), Distribution.Shape], [0.1, 0.1], restartAtZeroShape: true);
        return z => gev.Maximum(p =>
        {
            if (p[1] <= -1) return double.PositiveInfinity;
            double scale = Math.Exp(p[0]);
            double location = Math.Abs(p[1]) < GevDistribution.GumbelShapeTolerance
                ? z + scale * logY
                : z - scale * GevDistribution.ReducedQuantileTerm(p[1], logY);
            return -GevDistribution.LogLikelihood(sample, location, scale, p[1]);
        });
    }
}
