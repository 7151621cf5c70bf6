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
            double target = maximumLogLikelihood - 0.5 * ChiSquared.InvCDF(1, confidenceLevel);
            double Excess(double z) => profileLogLikelihood(z) - target;
            double accuracy = 1e-9 * Math.Max(Math.Abs(estimate), initialStep);
            double upper = Bound(Excess, estimate, upward: true, initialStep, double.PositiveInfinity, accuracy);
            double lower = Bound(Excess, estimate, upward: false, initialStep, lowerLimit, accuracy);
            return (lower, upper);
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

    /// <summary>
    /// One bound: steps away from the estimate, doubling the step, until the profile falls below the target, then finds
    /// the crossing. A trial at or beyond <paramref name="limit"/> is impossible, so the next trial goes halfway from
    /// the last value inside to the limit instead. The limit itself when the profile never falls far enough.
    /// </summary>
    private static double Bound(Func<double, double> excess, double estimate, bool upward, double initialStep, double limit, double accuracy)
    {
        double inside = estimate, step = initialStep;
        for (int i = 0; i < MaximumExpansions; i++)
        {
            double trial = upward ? estimate + step : estimate - step;
            if (upward ? trial >= limit : trial <= limit)
                trial = limit + 0.5 * (inside - limit);
            if (excess(trial) < 0)
                return Root(excess, inside, trial, accuracy);
            inside = trial;
            step *= 2;
        }
        return limit;
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
