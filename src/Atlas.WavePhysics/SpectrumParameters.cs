namespace Atlas.WavePhysics;

/// <summary>Sea-state parameters integrated from a discrete frequency spectrum S(f).</summary>
/// <param name="M0">Zeroth moment m0, m^2.</param>
/// <param name="MMinus1">m-1, m^2 s.</param>
/// <param name="M1">m1, m^2 / s.</param>
/// <param name="M2">m2, m^2 / s^2.</param>
/// <param name="Hm0">Spectral significant wave height 4 sqrt(m0), m.</param>
/// <param name="EnergyPeriod">Te = Tm-1,0 = m-1 / m0, s.</param>
/// <param name="MeanPeriod">Tm01 = m0 / m1, s.</param>
/// <param name="ZeroCrossingPeriod">Tm02 = sqrt(m0 / m2), s.</param>
/// <param name="PeakPeriod">Tp = 1 / f of the largest density, s (the first such frequency if several share it).</param>
/// <param name="SpectralWidth">eps0 = sqrt(m0 m-2 / m-1^2 - 1).</param>
/// <param name="PowerKilowattsPerMetre">J = rho g integral cg(f, h) S(f) df, kW/m.</param>
public readonly record struct SpectrumParameters(
    double M0,
    double MMinus1,
    double M1,
    double M2,
    double Hm0,
    double EnergyPeriod,
    double MeanPeriod,
    double ZeroCrossingPeriod,
    double PeakPeriod,
    double SpectralWidth,
    double PowerKilowattsPerMetre);
