namespace Atlas.WavePhysics;

/// <summary>
/// Moments and sea-state parameters of a discrete variance density spectrum S(f) (m^2/Hz at frequencies in Hz).
/// </summary>
/// <remarks>
/// Integrals use the trapezoidal rule over the given frequencies, which may be unevenly spaced (wave models
/// often use geometric spacing); nothing is added for the tails beyond the first and last frequency.
/// Frequencies must be positive, finite and strictly increasing; densities finite and not negative.
/// </remarks>
public static class SpectralMoments
{
    /// <summary>m_n = integral f^n S(f) df.</summary>
    /// <param name="frequencies">Frequencies, Hz.</param>
    /// <param name="density">S(f), m^2/Hz.</param>
    /// <param name="order">n; negative orders are allowed (m-1 gives Te).</param>
    public static double Moment(ReadOnlySpan<double> frequencies, ReadOnlySpan<double> density, int order)
    {
        Check(frequencies, density);
        return MomentUnchecked(frequencies, density, order);
    }

    /// <summary>Every parameter of <see cref="SpectrumParameters"/>; power at the given depth.</summary>
    /// <param name="frequencies">Frequencies, Hz.</param>
    /// <param name="density">S(f), m^2/Hz.</param>
    /// <param name="depthMetres">Depth for the group velocity, m; NaN or +infinity means deep water.</param>
    /// <returns>Parameters; an all-zero spectrum gives Hm0 = 0, power 0 and NaN periods.</returns>
    public static SpectrumParameters Parameters(ReadOnlySpan<double> frequencies, ReadOnlySpan<double> density, double depthMetres = double.NaN)
    {
        Check(frequencies, density);
        DispersionRelation.CheckDepth(depthMetres);
        double m0 = MomentUnchecked(frequencies, density, 0);
        double mMinus1 = MomentUnchecked(frequencies, density, -1);
        double mMinus2 = MomentUnchecked(frequencies, density, -2);
        double m1 = MomentUnchecked(frequencies, density, 1);
        double m2 = MomentUnchecked(frequencies, density, 2);

        int peak = 0;
        for (int i = 1; i < density.Length; i++)
            if (density[i] > density[peak]) peak = i;
        double peakPeriod = density[peak] > 0 ? 1.0 / frequencies[peak] : double.NaN;

        double flux = 0;
        double previous = 0;
        for (int i = 0; i < frequencies.Length; i++)
        {
            double current = DispersionRelation.GroupVelocity(1.0 / frequencies[i], depthMetres) * density[i];
            if (i > 0) flux += 0.5 * (previous + current) * (frequencies[i] - frequencies[i - 1]);
            previous = current;
        }
        double power = PhysicalConstants.SeawaterDensity * PhysicalConstants.Gravity * flux / 1000.0;

        return new SpectrumParameters(
            M0: m0,
            MMinus1: mMinus1,
            M1: m1,
            M2: m2,
            Hm0: 4 * Math.Sqrt(m0),
            EnergyPeriod: mMinus1 / m0,
            MeanPeriod: m0 / m1,
            ZeroCrossingPeriod: Math.Sqrt(m0 / m2),
            PeakPeriod: peakPeriod,
            SpectralWidth: Math.Sqrt(Math.Max(0, m0 * mMinus2 / (mMinus1 * mMinus1) - 1)),
            PowerKilowattsPerMetre: power);
    }

    private static double MomentUnchecked(ReadOnlySpan<double> frequencies, ReadOnlySpan<double> density, int order)
    {
        double sum = 0;
        double previous = Math.Pow(frequencies[0], order) * density[0];
        for (int i = 1; i < frequencies.Length; i++)
        {
            double current = Math.Pow(frequencies[i], order) * density[i];
            sum += 0.5 * (previous + current) * (frequencies[i] - frequencies[i - 1]);
            previous = current;
        }
        return sum;
    }

    internal static void Check(ReadOnlySpan<double> frequencies, ReadOnlySpan<double> density)
    {
        if (frequencies.Length != density.Length)
            throw new ArgumentException($"The spectrum has {frequencies.Length} frequencies but {density.Length} densities.", nameof(density));
        if (frequencies.Length < 2)
            throw new ArgumentException("A spectrum needs at least two frequencies.", nameof(frequencies));
        for (int i = 0; i < frequencies.Length; i++)
        {
            double f = frequencies[i];
            if (!(f > 0) || double.IsInfinity(f))
                throw new ArgumentException($"Frequency {i} is {f} Hz; frequencies must be positive and finite.", nameof(frequencies));
            if (i > 0 && !(f > frequencies[i - 1]))
                throw new ArgumentException($"Frequency {i} ({f} Hz) does not increase on frequency {i - 1} ({frequencies[i - 1]} Hz).", nameof(frequencies));
            double s = density[i];
            if (!(s >= 0) || double.IsInfinity(s))
                throw new ArgumentException($"Density {i} is {s} m^2/Hz; densities must be finite and not negative.", nameof(density));
        }
    }
}
