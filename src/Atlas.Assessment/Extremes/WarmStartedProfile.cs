namespace Atlas.Assessment.Extremes;

/// <summary>
/// Maximises a likelihood over the parameters other than a profiled quantity, at one value of the quantity after
/// another, each time starting the simplex from the previous solution: near values have near maxima.
/// </summary>
/// <param name="start">Where the first maximisation starts (the fitted parameters).</param>
/// <param name="steps">Initial simplex steps, one a parameter.</param>
/// <param name="restartAtZeroShape">
/// True when the last parameter is a shape ξ whose sign bounds the support: where the previous solution is
/// impossible at the new value, the search restarts from it with ξ = 0 (the widest support), and the profile is -∞
/// where that is impossible too. False when every start is possible (the Gumbel fit, supported on the whole line).
/// </param>
internal sealed class WarmStartedProfile(double[] start, double[] steps, bool restartAtZeroShape)
{
    private double[] _previous = start;

    /// <summary>The maximised log-likelihood, given the negative log-likelihood at this value of the quantity.</summary>
    /// <exception cref="InvalidOperationException">The simplex does not converge (or, without restarts, the start is impossible).</exception>
    public double Maximum(Func<double[], double> negativeLogLikelihood)
    {
        double[] from = _previous;
        if (restartAtZeroShape)
        {
            if (!double.IsFinite(negativeLogLikelihood(from)))
                from = [.. from[..^1], 0.0];
            if (!double.IsFinite(negativeLogLikelihood(from)))
                return double.NegativeInfinity;
        }
        var (point, value) = NelderMeadMinimiser.Minimise(negativeLogLikelihood, from, steps);
        _previous = point;
        return -value;
    }
}
