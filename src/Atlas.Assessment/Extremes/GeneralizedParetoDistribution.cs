using MathNet.Numerics;

namespace Atlas.Assessment.Extremes;

/// <summary>
/// The generalised Pareto distribution of excesses y = x - u over a threshold u,
/// P(Y &gt; y) = (1 + ξ y/σ)^(-1/ξ) where 1 + ξ y/σ &gt; 0, and its exponential limit exp(-y/σ) at ξ = 0.
/// </summary>
/// <remarks>
/// Shape sign as in Coles (2001): ξ &gt; 0 heavy tail, ξ &lt; 0 bounded at y = -σ/ξ. SciPy's
/// <c>scipy.stats.genpareto</c> shape c has the same sign (c = ξ).
/// </remarks>
/// <param name="Scale">σ, above 0.</param>
/// <param name="Shape">ξ.</param>
public readonly record struct GeneralizedParetoDistribution(double Scale, double Shape) : ILogDensity
{
    /// <summary>P(Y ≤ y) for an excess y; 0 for y below 0, 1 beyond the upper bound.</summary>
    public double Cdf(double excess)
    {
        if (excess <= 0)
            return 0.0;
        if (Math.Abs(Shape) < GevDistribution.GumbelShapeTolerance)
            return -SpecialFunctions.Expm1(-excess / Scale);
        double shapeY = Shape * excess / Scale;
        if (shapeY <= -1)
            return 1.0;
        return -SpecialFunctions.Expm1(-SpecialFunctions.Log1p(shapeY) / Shape);
    }

    /// <summary>The excess y with P(Y ≤ y) = <paramref name="probability"/>; +∞ at 1 when unbounded.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The probability is outside 0..1.</exception>
    public double Quantile(double probability)
    {
        ProbabilityArgument.Require(probability);
        // y = σ ((1 - p)^(-ξ) - 1)/ξ.
        double logSurvival = Math.Log(1 - probability);
        if (Math.Abs(Shape) < GevDistribution.GumbelShapeTolerance)
            return -Scale * logSurvival;
        return Scale * GevDistribution.ReducedQuantileTerm(Shape, logSurvival);
    }

    /// <summary>Log of the density at excess <paramref name="excess"/>; -∞ outside the support.</summary>
    public double LogDensity(double excess)
    {
        if (excess < 0)
            return double.NegativeInfinity;
        if (Math.Abs(Shape) < GevDistribution.GumbelShapeTolerance)
            return -Math.Log(Scale) - excess / Scale;
        double shapeY = Shape * excess / Scale;
        if (shapeY <= -1)
            return double.NegativeInfinity;
        return -Math.Log(Scale) - (1 + 1 / Shape) * SpecialFunctions.Log1p(shapeY);
    }

    /// <summary>Log-likelihood of excesses; -∞ when any lies outside the support or σ ≤ 0.</summary>
    public static double LogLikelihood(ReadOnlySpan<double> excesses, double scale, double shape)
    {
        if (!(scale > 0))
            return double.NegativeInfinity;
        return SampleLogLikelihood.Of(excesses, new GeneralizedParetoDistribution(scale, shape));
    }
}
