using System.Runtime.CompilerServices;

namespace Atlas.WavePhysics;

/// <summary>
/// Energy period from peak period for an assumed spectral shape, for hindcasts that give Tp but not Te.
/// </summary>
/// <remarks>
/// The ratios are those of IEC TS 62600-101: Te = 0.9 Tp for JONSWAP with gamma = 3.3 and Te = 0.857 Tp for
/// Pierson-Moskowitz (the exact Pierson-Moskowitz value is 1.25^(-1/4) Gamma(5/4) = 0.8572).
/// </remarks>
public static class PeriodConversion
{
    /// <summary>Te / Tp for the shape.</summary>
    public static double EnergyToPeakPeriodRatio(SpectrumShape shape) => shape switch
    {
        SpectrumShape.JonswapGamma33 => 0.9,
        SpectrumShape.PiersonMoskowitz => 0.857,
        _ => throw new ArgumentOutOfRangeException(nameof(shape), shape, "Unknown spectrum shape."),
    };

    /// <summary>Te (s) from Tp (s) for the shape; NaN gives NaN.</summary>
    public static double EnergyPeriodFromPeakPeriod(double peakPeriodSeconds, SpectrumShape shape = SpectrumShape.JonswapGamma33) =>
        peakPeriodSeconds * EnergyToPeakPeriodRatio(shape);

    /// <summary>Tp (s) from Te (s) for the shape; NaN gives NaN.</summary>
    public static double PeakPeriodFromEnergyPeriod(double energyPeriodSeconds, SpectrumShape shape = SpectrumShape.JonswapGamma33) =>
        energyPeriodSeconds / EnergyToPeakPeriodRatio(shape);

    /// <summary>Te per step from Tp per step; NaN, zero or negative Tp gives NaN.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static void EnergyPeriodFromPeakPeriod(ReadOnlySpan<float> peakPeriodSeconds, Span<float> energyPeriodSeconds,
        SpectrumShape shape = SpectrumShape.JonswapGamma33)
    {
        if (energyPeriodSeconds.Length < peakPeriodSeconds.Length)
            throw new ArgumentException($"The output holds {energyPeriodSeconds.Length} steps but {peakPeriodSeconds.Length} are needed.", nameof(energyPeriodSeconds));
        float ratio = (float)EnergyToPeakPeriodRatio(shape);
        for (int i = 0; i < peakPeriodSeconds.Length; i++)
        {
            float tp = peakPeriodSeconds[i];
            energyPeriodSeconds[i] = tp > 0 ? tp * ratio : float.NaN;
        }
    }
}
