using MathNet.Numerics;

namespace Atlas.Assessment.Extremes;

/// <summary>
/// The generalised extreme value distribution,
/// F(x) = exp(-[1 + ξ (x - μ)/σ]^(-1/ξ)) where 1 + ξ (x - μ)/σ &gt; 0,
/// and its Gumbel limit F(x) = exp(-exp(-(x - μ)/σ)) at ξ = 0.
/// </summary>
/// <remarks>
/// Shape sign convention (Coles 2001, <i>An Introduction to Statistical Modeling of Extreme Values</i>):
/// ξ &gt; 0 is the heavy-tailed Fréchet type, ξ &lt; 0 the bounded Weibull type. SciPy's
/// <c>scipy.stats.genextreme</c> uses the opposite sign, c = -ξ (see <see cref="ScipyShapeC"/>).
/// </remarks>
/// <param name="Location">μ.</param>
/// <param name="Scale">σ, above 0.</param>
/// <param name="Shape">ξ (Coles' sign; 0 is Gumbel).</param>
public readonly record struct GevDistribution(double Location, double Scale, double Shape) : ILogDensity
{
    /// <summary>Shapes closer to 0 than this use the Gumbel formulas, which they equal to double precision.</summary>
    internal const double GumbelShapeTolerance = 1e-12;

    /// <summary>SciPy's <c>genextreme</c> shape parameter c = -ξ.</summary>
    public double ScipyShapeC => -Shape;

    /// <summary>P(X ≤ x). Below the lower support bound 0; above the upper bound 1.</summary>
    public double Cdf(double x)
    {
        double z = (x - Location) / Scale;
        if (Math.Abs(Shape) < GumbelShapeTolerance)
            return Math.Exp(-Math.Exp(-z));
        double shapeZ = Shape * z;
        if (shapeZ <= -1)
            return Shape > 0 ? 0.0 : 1.0;
        return Math.Exp(-Math.Exp(-SpecialFunctions.Log1p(shapeZ) / Shape));
    }

    /// <summary>
    /// The quantile x with P(X ≤ x) = <paramref name="probability"/>. Returns -∞ at 0 when the
    /// distribution is unbounded below and +∞ at 1 when it is unbounded above.
    /// </summary>
    /// <exception cref="ArgumentOutOfRangeException">The probability is outside 0..1.</exception>
    public double Quantile(double probability)
    {
        ProbabilityArgument.Require(probability);
        // x = μ + σ ((-ln p)^(-ξ) - 1) / ξ, written with expm1 so small ξ keeps full precision.
        double logY = Math.Log(-Math.Log(probability));
        if (Math.Abs(Shape) < GumbelShapeTolerance)
            return Location - Scale * logY;
        return Location + Scale * ReducedQuantileTerm(Shape, logY);
    }

    /// <summary>Log of the density at <paramref name="x"/>; -∞ outside the support.</summary>
    public double LogDensity(double x)
    {
        double z = (x - Location) / Scale;
        if (Math.Abs(Shape) < GumbelShapeTolerance)
            return -Math.Log(Scale) - z - Math.Exp(-z);
        double shapeZ = Shape * z;
        if (shapeZ <= -1)
            return double.NegativeInfinity;
        double logT = SpecialFunctions.Log1p(shapeZ);
        return -Math.Log(Scale) - (1 + 1 / Shape) * logT - Math.Exp(-logT / Shape);
    }

    /// <summary>
    /// The level an annual maximum exceeds with probability 1/T: the quantile at 1 - 1/T.
    /// Undefined (NaN) for T ≤ 1, where every year's maximum exceeds it.
    /// </summary>
    public double AnnualReturnLevel(double returnPeriodYears) =>
        returnPeriodYears > 1 ? Quantile(1 - 1 / returnPeriodYears) : double.NaN;

    /// <summary>(y^(-ξ) - 1)/ξ with log y given, i.e. expm1(-ξ log y)/ξ.</summary>
    internal static double ReducedQuantileTerm(double shape, double logY)
    {
        return SpecialFunctions.Expm1(-shape * logY) / shape;
    }

    /// <summary>Log-likelihood of a sample; -∞ when any value lies outside the support or σ ≤ 0.</summary>
    public static double LogLikelihood(ReadOnlySpan<double> sample, double location, double scale, double shape)
    {
        if (!(scale > 0))
            return double.NegativeInfinity;
        return SampleLogLikelihood.Of(sample, new GevDistribution(location, scale, shape));
    }
}
