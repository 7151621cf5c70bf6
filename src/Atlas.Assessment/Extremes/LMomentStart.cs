using MathNet.Numerics;

namespace Atlas.Assessment.Extremes;

/// <summary>
/// Starting values for the GEV likelihood from sample L-moments (Hosking, Wallis and Wood 1985,
/// the rational approximation for the shape). Only a start: the fit itself is maximum likelihood.
/// </summary>
internal static class LMomentStart
{
    public static GevDistribution Gev(double[] sorted)
    {
        int n = sorted.Length;
        double b0 = 0, b1 = 0, b2 = 0;
        for (int i = 0; i < n; i++)
        {
            b0 += sorted[i];
            b1 += sorted[i] * i / (n - 1.0);
            b2 += sorted[i] * i * (i - 1.0) / ((n - 1.0) * (n - 2.0));
        }
        b0 /= n; b1 /= n; b2 /= n;
        double l1 = b0, l2 = 2 * b1 - b0, l3 = 6 * b2 - 6 * b1 + b0;
        double t3 = l3 / l2;
        double c = 2 / (3 + t3) - Math.Log(2) / Math.Log(3);
        double k = 7.8590 * c + 2.9554 * c * c; // Hosking's k = -ξ
        if (Math.Abs(k) < 1e-6)
        {
            double gumbelScale = l2 / Math.Log(2);
            return new GevDistribution(l1 - Constants.EulerMascheroni * gumbelScale, gumbelScale, 0);
        }
        double gamma = SpecialFunctions.Gamma(1 + k);
        double scale = l2 * k / ((1 - Math.Pow(2, -k)) * gamma);
        double location = l1 - scale * (1 - gamma) / k;
        return new GevDistribution(location, scale, -k);
    }
}
