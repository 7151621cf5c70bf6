using MathNet.Numerics.Statistics;

namespace Atlas.Assessment.Extremes;

/// <summary>Maximum-likelihood fit of the generalised Pareto distribution to excesses over a threshold.</summary>
public static class GpdMaximumLikelihood
{
    /// <summary>
    /// Fits the GPD to the excesses of <paramref name="peaks"/> over <paramref name="threshold"/>
    /// (location fixed at the threshold, like SciPy's <c>genpareto.fit(excesses, floc=0)</c>) by
    /// maximising the likelihood with a Nelder-Mead simplex from a method-of-moments start and from
    /// the exponential fit (ξ = 0); the better result is kept. The shape is restricted to ξ &gt; -1,
    /// where the estimator exists (Coles 2001, §4.3.2).
    /// </summary>
    /// <param name="peaks">Values above the threshold (storm peaks after declustering).</param>
    /// <param name="threshold">The threshold u.</param>
    /// <param name="exceedancesPerYear">Mean number of peaks per year, λ, used for return levels.</param>
    /// <exception cref="ArgumentException">Fewer than <see cref="GevMaximumLikelihood.MinimumSampleSize"/> peaks,
    /// a peak at or below the threshold, all peaks equal, or a rate that is not positive.</exception>
    public static GpdFit Fit(ReadOnlySpan<double> peaks, double threshold, double exceedancesPerYear)
    {
        if (!double.IsFinite(threshold))
            throw new ArgumentException("The threshold must be a finite number.", nameof(threshold));
        if (!(exceedancesPerYear > 0) || !double.IsFinite(exceedancesPerYear))
            throw new ArgumentException($"The rate of exceedances must be a positive number per year; got {exceedancesPerYear}.", nameof(exceedancesPerYear));
        double[] sortedPeaks = GevMaximumLikelihood.CheckedSortedSample(peaks, nameof(peaks));
        if (sortedPeaks[0] <= threshold)
            throw new ArgumentException($"Every peak must exceed the threshold {threshold}; the smallest is {sortedPeaks[0]}.", nameof(peaks));

        double[] excesses = [.. sortedPeaks.Select(x => x - threshold)];
        double NegativeLogLikelihood(double[] p) =>
            p[1] <= -1 ? double.PositiveInfinity : -GeneralizedParetoDistribution.LogLikelihood(excesses, Math.Exp(p[0]), p[1]);

        double mean = excesses.Mean();
        double variance = excesses.PopulationVariance();
        var starts = new List<double[]> { new[] { Math.Log(mean), 0.0 } };
        double momentShape = Math.Clamp(0.5 * (1 - mean * mean / variance), -0.5, 0.5);
        double momentScale = 0.5 * mean * (1 + mean * mean / variance);
        double[] momentStart = [Math.Log(momentScale), momentShape];
        if (momentScale > 0 && double.IsFinite(NegativeLogLikelihood(momentStart)))
            starts.Add(momentStart);

        var best = NelderMeadMinimiser.MinimiseFromEach(NegativeLogLikelihood, starts, [0.1, 0.1]);
        var distribution = new GeneralizedParetoDistribution(Math.Exp(best.Point[0]), best.Point[1]);
        return new GpdFit(sortedPeaks, threshold, exceedancesPerYear, distribution, -best.Value);
    }
}
