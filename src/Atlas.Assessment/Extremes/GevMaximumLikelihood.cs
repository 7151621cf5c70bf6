using MathNet.Numerics.RootFinding;
using MathNet.Numerics.Statistics;

namespace Atlas.Assessment.Extremes;

/// <summary>Maximum-likelihood fits of the GEV and Gumbel distributions to block maxima.</summary>
public static class GevMaximumLikelihood
{
    /// <summary>Fewest values a fit accepts.</summary>
    public const int MinimumSampleSize = 5;

    /// <summary>
    /// Fits the three-parameter GEV by maximising the likelihood (Nelder-Mead simplex from an
    /// L-moment start and from the Gumbel fit; the better result is kept). The shape is restricted
    /// to ξ &gt; -1, where the maximum-likelihood estimator exists (Smith 1985; Coles 2001, §3.3.2).
    /// </summary>
    /// <exception cref="ArgumentException">Fewer than <see cref="MinimumSampleSize"/> values, NaN, or all values equal.</exception>
    public static GevFit FitGev(ReadOnlySpan<double> maxima)
    {
        double[] sample = CheckedSortedSample(maxima, nameof(maxima));
        var gumbel = FitGumbelSorted(sample);

        double NegativeLogLikelihood(double[] p) =>
            p[2] <= -1 ? double.PositiveInfinity : -GevDistribution.LogLikelihood(sample, p[0], Math.Exp(p[1]), p[2]);

        var starts = new List<double[]> { new[] { gumbel.Location, Math.Log(gumbel.Scale), 0.0 } };
        var moments = LMomentStart.Gev(sample);
        if (moments.Scale > 0 && double.IsFinite(moments.Shape))
        {
            double[] start = [moments.Location, Math.Log(moments.Scale), Math.Clamp(moments.Shape, -0.5, 0.5)];
            if (double.IsFinite(NegativeLogLikelihood(start)))
                starts.Add(start);
        }

        var best = NelderMeadMinimiser.MinimiseFromEach(NegativeLogLikelihood, starts, [0.1 * gumbel.Scale, 0.1, 0.1]);
        var fitted = new GevDistribution(best.Point[0], Math.Exp(best.Point[1]), best.Point[2]);
        return new GevFit(sample, fitted, -best.Value, shapeFixedAtZero: false);
    }

    /// <summary>
    /// Fits the Gumbel distribution (GEV with ξ = 0) by maximum likelihood, solving the likelihood
    /// equation for the scale, σ = mean(x) - Σ x e^(-x/σ) / Σ e^(-x/σ), with Brent's method, then
    /// μ = -σ ln(mean e^(-x/σ)).
    /// </summary>
    /// <exception cref="ArgumentException">Fewer than <see cref="MinimumSampleSize"/> values, NaN, or all values equal.</exception>
    public static GevFit FitGumbel(ReadOnlySpan<double> maxima)
    {
        double[] sample = CheckedSortedSample(maxima, nameof(maxima));
        var fitted = FitGumbelSorted(sample);
        return new GevFit(sample, fitted, GevDistribution.LogLikelihood(sample, fitted.Location, fitted.Scale, 0), shapeFixedAtZero: true);
    }

    private static GevDistribution FitGumbelSorted(double[] sorted)
    {
        double minimum = sorted[0];
        double mean = sorted.Mean();
        double spread = sorted.PopulationStandardDeviation();

        // Weights e^(-(x - min)/σ) are at most 1, so nothing overflows for any σ.
        double WeightedMean(double scale)
        {
            double sumWeights = 0, sumWeighted = 0;
            foreach (double x in sorted)
            {
                double weight = Math.Exp(-(x - minimum) / scale);
                sumWeights += weight;
                sumWeighted += weight * x;
            }
            return sumWeighted / sumWeights;
        }

        // g(σ) < 0 as σ → 0 (the weighted mean tends to the minimum) and g > 0 beyond mean - min + sd.
        double LikelihoodEquation(double scale) => scale - mean + WeightedMean(scale);
        double scaleEstimate = Brent.FindRoot(LikelihoodEquation, 1e-8 * spread, mean - minimum + spread, 1e-13 * spread, 500);

        double sumExp = 0;
        foreach (double x in sorted)
            sumExp += Math.Exp(-(x - minimum) / scaleEstimate);
        double location = minimum - scaleEstimate * Math.Log(sumExp / sorted.Length);
        return new GevDistribution(location, scaleEstimate, 0);
    }

    internal static double[] CheckedSortedSample(ReadOnlySpan<double> values, string name)
    {
        if (values.Length < MinimumSampleSize)
            throw new ArgumentException($"A fit needs at least {MinimumSampleSize} values; got {values.Length}.", name);
        foreach (double value in values)
            if (!double.IsFinite(value))
                throw new ArgumentException("Values to fit must be finite numbers.", name);
        double[] sorted = values.ToArray();
        Array.Sort(sorted);
        if (sorted[0] == sorted[^1])
            throw new ArgumentException($"All {sorted.Length} values equal {sorted[0]}: no spread to fit a distribution to.", name);
        return sorted;
    }
}
