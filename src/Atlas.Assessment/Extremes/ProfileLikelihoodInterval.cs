using MathNet.Numerics.Distributions;
using MathNet.Numerics.RootFinding;

namespace Atlas.Assessment.Extremes;

/// <summary>
/// Confidence interval of a quantity by profile likelihood (Coles 2001, §2.6.6 and §3.3.3): the
/// values z whose profile log-likelihood lies within ½ χ²₁(level) of the maximum.
/// </summary>
internal static class ProfileLikelihoodInterval
{
    private const int MaximumExpansions = 40;

    /// <param name="profileLogLikelihood">Maximised log-likelihood with the quantity held at z; -∞ where impossible.</param>
    /// <param name="estimate">Maximum-likelihood estimate of the quantity.</param>
    /// <param name="maximumLogLikelihood">Log-likelihood at the estimate.</param>
    /// <param name="confidenceLevel">Coverage, in (0, 1).</param>
    /// <param name="initialStep">First trial distance from the estimate, in the quantity's units.</param>
    /// <param name="lowerLimit">Values at or below this are impossible (−∞ for none).</param>
    /// <returns>Bounds; the upper is +∞ when the profile does not fall far enough within 2^40 steps.</returns>
    /// <remarks>When a nested maximisation fails to converge both bounds come back NaN; the caller notes it.</remarks>
    public static (double Lower, double Upper) Find(
        Func<double, double> profileLogLikelihood,
        double estimate,
        double maximumLogLikelihood,
        double confidenceLevel,
        double initialStep,
        double lowerLimit)
    {
        try
        {
            return Search(profileLogLikelihood, estimate, maximumLogLikelihood, confidenceLevel, initialStep, lowerLimit);
        }
        catch (InvalidOperationException)
        {
            return (double.NaN, double.NaN);
        }
    }

    /// <summary>Text for a result whose interval could not be found or is open above; null when neither.</summary>
    public static string? Describe(double lower, double upper)
    {
        if (double.IsNaN(lower) || double.IsNaN(upper))
            return "The profile likelihood could not be maximised near this level, so no confidence interval is given.";
        if (double.IsPositiveInfinity(upper))
            return "The profile likelihood does not bound the level from above: the data are consistent with arbitrarily large values.";
        return null;
    }

    private static (double Lower, double Upper) Search(
        Func<double, double> profileLogLikelihood,
        double estimate,
        double maximumLogLikelihood,
        double confidenceLevel,
        double initialStep,
        double lowerLimit)
    {
        double target = maximumLogLikelihood - 0.5 * ChiSquared.InvCDF(1, confidenceLevel);
        double Excess(double z) => profileLogLikelihood(z) - target;
        double accuracy = 1e-9 * Math.Max(Math.Abs(estimate), initialStep);

        double upper = double.PositiveInfinity;
        double inside = estimate, step = initialStep;
        for (int i = 0; i < MaximumExpansions; i++)
        {
            double trial = estimate + step;
            if (Excess(trial) < 0)
            {
                upper = Root(Excess, inside, trial, accuracy);
                break;
            }
            inside = trial;
            step *= 2;
        }

        double lower = lowerLimit;
        inside = estimate;
        step = initialStep;
        for (int i = 0; i < MaximumExpansions; i++)
        {
            double trial = estimate - step;
            if (trial <= lowerLimit)
                trial = lowerLimit + 0.5 * (inside - lowerLimit);
            if (Excess(trial) < 0)
            {
                lower = Root(Excess, trial, inside, accuracy);
                break;
            }
            inside = trial;
            step *= 2;
        }
        return (lower, upper);
    }

    /// <summary>Brent's method on a bracket with f(a) and f(b) of opposite sign; bisection if Brent gives up.</summary>
    private static double Root(Func<double, double> f, double a, double b, double accuracy)
    {
        double low = Math.Min(a, b), high = Math.Max(a, b);
        if (Brent.TryFindRoot(f, low, high, accuracy, 200, out double root))
            return root;
        double fLow = f(low);
        for (int i = 0; i < 200 && high - low > accuracy; i++)
        {
            double middle = 0.5 * (low + high);
            double fMiddle = f(middle);
            if (Math.Sign(fMiddle) == Math.Sign(fLow)) { low = middle; fLow = fMiddle; }
            else high = middle;
        }
        return 0.5 * (low + high);
    }
}
