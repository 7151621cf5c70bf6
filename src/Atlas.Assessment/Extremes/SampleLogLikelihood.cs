namespace Atlas.Assessment.Extremes;

/// <summary>A distribution with a log density, -∞ outside its support.</summary>
internal interface ILogDensity
{
    double LogDensity(double x);
}

/// <summary>The log-likelihood of independent values: the sum of their log densities.</summary>
internal static class SampleLogLikelihood
{
    /// <summary>Σ log f(x), or -∞ as soon as one value lies outside the support (the sum is then -∞ anyway).</summary>
    /// <remarks>Generic over a struct so that the JIT compiles one loop a distribution, with no call through an interface.</remarks>
    public static double Of<TDistribution>(ReadOnlySpan<double> sample, TDistribution distribution)
        where TDistribution : struct, ILogDensity
    {
        double sum = 0;
        foreach (double x in sample)
        {
            double logDensity = distribution.LogDensity(x);
            if (double.IsNegativeInfinity(logDensity))
                return double.NegativeInfinity;
            sum += logDensity;
        }
        return sum;
    }
}
