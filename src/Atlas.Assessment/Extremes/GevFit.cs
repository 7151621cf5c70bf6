namespace Atlas.Assessment.Extremes;

/// <summary>A GEV or Gumbel distribution fitted by maximum likelihood to annual maxima, with its sample.</summary>
public sealed class GevFit
{
    private readonly double[] _sortedSample;

    internal GevFit(double[] sortedSample, GevDistribution distribution, double logLikelihood, bool shapeFixedAtZero)
    {
        _sortedSample = sortedSample;
        Distribution = distribution;
        LogLikelihood = logLikelihood;
        ShapeFixedAtZero = shapeFixedAtZero;
    }

    /// <summary>The fitted distribution.</summary>
    public GevDistribution Distribution { get; }

    /// <summary>True for a Gumbel fit (ξ held at 0); false for the three-parameter GEV.</summary>
    public bool ShapeFixedAtZero { get; }

    /// <summary>Maximised log-likelihood.</summary>
    public double LogLikelihood { get; }

    /// <summary>The fitted values, ascending.</summary>
    public IReadOnlyList<double> Sample => _sortedSample;

    /// <summary>
    /// The T-year return level of annual maxima, the quantile at 1 - 1/T, with a profile-likelihood
    /// confidence interval (Coles 2001, §3.3.3: the GEV reparametrised by the return level, the
    /// other parameters maximised out, bounds where the deviance reaches χ²₁(level)).
    /// </summary>
    /// <remarks>
    /// T = 1 year (or less) is undefined from annual maxima: every year's maximum exceeds the level
    /// with probability 1 - 1/T = 0, so the level is -∞ (Gumbel) or the lower support bound. It is
    /// returned as NaN with a note; estimate it from peaks over threshold instead. The fit knows the
    /// record length (one value per year), so long extrapolations are marked.
    /// </remarks>
    /// <exception cref="ArgumentOutOfRangeException">T is not a positive finite number, or the level is outside (0, 1).</exception>
    public ReturnLevel ReturnLevel(double returnPeriodYears, double confidenceLevel = 0.95)
    {
        if (!double.IsFinite(returnPeriodYears) || returnPeriodYears <= 0)
            throw new ArgumentOutOfRangeException(nameof(returnPeriodYears), returnPeriodYears, "A return period is a positive number of years.");
        if (!(confidenceLevel > 0 && confidenceLevel < 1))
            throw new ArgumentOutOfRangeException(nameof(confidenceLevel), confidenceLevel, "A confidence level lies strictly between 0 and 1.");
        bool longExtrapolation = ExtremeCaution.IsLongExtrapolation(returnPeriodYears, _sortedSample.Length);
        if (returnPeriodYears <= 1)
            return new ReturnLevel(returnPeriodYears, double.NaN, double.NaN, double.NaN, confidenceLevel, longExtrapolation,
                "Undefined from annual maxima: a level with a return period of one year or less is exceeded by every " +
                "annual maximum (non-exceedance probability 1 - 1/T ≤ 0). Use the peaks-over-threshold estimate.");

        double level = Distribution.AnnualReturnLevel(returnPeriodYears);
        double logY = Math.Log(-Math.Log(1 - 1 / returnPeriodYears));
        var (lower, upper) = ProfileLikelihoodInterval.Find(
            ProfileAt(logY), level, LogLikelihood, confidenceLevel, 0.2 * Distribution.Scale, double.NegativeInfinity);
        string? note = ProfileLikelihoodInterval.Describe(lower, upper);
        return new ReturnLevel(returnPeriodYears, level, lower, upper, confidenceLevel, longExtrapolation, note);
    }

    /// <summary>Fit diagnostics: each sample value against its plotting position and the fitted distribution.</summary>
    public IReadOnlyList<ProbabilityPlotPoint> ProbabilityPlot()
    {
        int n = _sortedSample.Length;
        return [.. _sortedSample.Select((x, i) =>
        {
            double empirical = (i + 1.0) / (n + 1.0);
            return new ProbabilityPlotPoint(x, empirical, Distribution.Cdf(x), Distribution.Quantile(empirical));
        })];
    }

    /// <summary>
    /// Profile log-likelihood of the return level z with reduced variate log y = log(-log(1 - 1/T)):
    /// μ = z - σ (y^(-ξ) - 1)/ξ, maximised over σ (and ξ unless it is held at 0).
    /// Each evaluation starts from the previous solution; if that is impossible at the new z it
    /// restarts from ξ = 0, whose support is the whole line.
    /// </summary>
    private Func<double, double> ProfileAt(double logY)
    {
        double[] sample = _sortedSample;
        double scaleStep = 0.1;
        if (ShapeFixedAtZero)
        {
            double[] last = [Math.Log(Distribution.Scale)];
            return z =>
            {
                double Objective(double[] p) => -GevDistribution.LogLikelihood(sample, z + Math.Exp(p[0]) * logY, Math.Exp(p[0]), 0);
                var (point, value) = NelderMeadMinimiser.Minimise(Objective, last, [scaleStep]);
                last = point;
                return -value;
            };
        }

        double[] previous = [Math.Log(Distribution.Scale), Distribution.Shape];
        return z =>
        {
            double Objective(double[] p)
            {
                if (p[1] <= -1) return double.PositiveInfinity;
                double scale = Math.Exp(p[0]);
                double location = Math.Abs(p[1]) < GevDistribution.GumbelShapeTolerance
                    ? z + scale * logY
                    : z - scale * GevDistribution.ReducedQuantileTerm(p[1], logY);
                return -GevDistribution.LogLikelihood(sample, location, scale, p[1]);
            }
            double[] start = double.IsFinite(Objective(previous)) ? previous : [previous[0], 0.0];
            if (!double.IsFinite(Objective(start)))
                return double.NegativeInfinity;
            var (point, value) = NelderMeadMinimiser.Minimise(Objective, start, [scaleStep, 0.1]);
            previous = point;
            return -value;
        };
    }
}
