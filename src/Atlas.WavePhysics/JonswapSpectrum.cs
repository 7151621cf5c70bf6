namespace Atlas.WavePhysics;

/// <summary>
/// The JONSWAP frequency spectrum for a given Hs, Tp and peak enhancement gamma, used to build test spectra.
/// </summary>
/// <remarks>
/// S(f) = A(gamma) (5/16) Hs^2 fp^4 f^-5 exp(-(5/4) (fp/f)^4) gamma^r, r = exp(-(f - fp)^2 / (2 sigma^2 fp^2)),
/// sigma = 0.07 for f at or below fp and 0.09 above, A(gamma) = 1 - 0.287 ln(gamma) (the normalisation of
/// DNV-RP-C205, which keeps 4 sqrt(m0) within about 1 % of Hs for gamma between 1 and 7). gamma = 1 is the
/// Pierson-Moskowitz spectrum, whose 4 sqrt(m0) equals Hs exactly.
/// </remarks>
public static class JonswapSpectrum
{
    /// <summary>The usual peak enhancement factor.</summary>
    public const double DefaultPeakEnhancement = 3.3;

    /// <summary>S(f), m^2/Hz.</summary>
    /// <param name="frequencyHz">f, Hz, positive.</param>
    /// <param name="significantWaveHeightMetres">Hs, m.</param>
    /// <param name="peakPeriodSeconds">Tp, s, positive.</param>
    /// <param name="peakEnhancement">gamma, at least 1.</param>
    public static double Density(double frequencyHz, double significantWaveHeightMetres, double peakPeriodSeconds,
        double peakEnhancement = DefaultPeakEnhancement)
    {
        Check(significantWaveHeightMetres, peakPeriodSeconds, peakEnhancement);
        if (!(frequencyHz > 0)) throw new ArgumentOutOfRangeException(nameof(frequencyHz), frequencyHz, "Frequency must be positive (Hz).");
        return DensityUnchecked(frequencyHz, significantWaveHeightMetres, peakPeriodSeconds, peakEnhancement);
    }

    /// <summary>S(f) at each frequency, m^2/Hz.</summary>
    public static double[] Density(ReadOnlySpan<double> frequenciesHz, double significantWaveHeightMetres, double peakPeriodSeconds,
        double peakEnhancement = DefaultPeakEnhancement)
    {
        Check(significantWaveHeightMetres, peakPeriodSeconds, peakEnhancement);
        var density = new double[frequenciesHz.Length];
        for (int i = 0; i < density.Length; i++)
        {
            double f = frequenciesHz[i];
            if (!(f > 0)) throw new ArgumentOutOfRangeException(nameof(frequenciesHz), f, $"Frequency {i} must be positive (Hz).");
            density[i] = DensityUnchecked(f, significantWaveHeightMetres, peakPeriodSeconds, peakEnhancement);
        }
        return density;
    }

    private static double DensityUnchecked(double f, double hs, double tp, double gamma)
    {
        double fp = 1.0 / tp;
        double sigma = f <= fp ? 0.07 : 0.09;
        double r = Math.Exp(-(f - fp) * (f - fp) / (2 * sigma * sigma * fp * fp));
        double ratio = fp / f;
        double pm = 5.0 / 16.0 * hs * hs * fp * fp * fp * fp / Math.Pow(f, 5) * Math.Exp(-1.25 * ratio * ratio * ratio * ratio);
        return (1 - 0.287 * Math.Log(gamma)) * pm * Math.Pow(gamma, r);
    }

    private static void Check(double hs, double tp, double gamma)
    {
        if (!(hs >= 0) || double.IsInfinity(hs)) throw new ArgumentOutOfRangeException("significantWaveHeightMetres", hs, "Hs must be finite and not negative (m).");
        if (!(tp > 0) || double.IsInfinity(tp)) throw new ArgumentOutOfRangeException("peakPeriodSeconds", tp, "Tp must be positive and finite (s).");
        if (!(gamma >= 1) || double.IsInfinity(gamma)) throw new ArgumentOutOfRangeException("peakEnhancement", gamma, "gamma must be at least 1.");
    }
}
