namespace Atlas.WavePhysics;

/// <summary>The parameters of one step of a spectral output point, integrated from its spectrum (IEC TS 62600-101 definitions).</summary>
/// <param name="Hm0">4 sqrt(m0), m.</param>
/// <param name="EnergyPeriod">Te = m-1 / m0, s.</param>
/// <param name="PeakPeriod">Tp = 1 / f of the largest density of the discrete frequency spectrum, s (no fitting between frequencies).</param>
/// <param name="Power">J = rho g sum cg(f, h) S(f) df at the point's depth, kW/m.</param>
/// <param name="ParametricPower">J from Hm0 and Te alone, with the group velocity of a wave of period Te at the same depth, kW/m.</param>
/// <param name="SpectralWidth">eps0 = sqrt(m0 m-2 / m-1^2 - 1).</param>
/// <param name="MeanDirectionFrom">Energy-weighted circular mean direction the waves come from, degrees; NaN without directions.</param>
/// <param name="DirectionalSpread">Circular spread sqrt(2 (1 - r1)) of the energy over direction, degrees; NaN without directions.</param>
/// <param name="Directionality">d = J_theta,max / J; NaN without directions or energy.</param>
/// <param name="MaximumPowerFrom">The direction (waves coming from, degrees) of the largest resolved power; NaN without directions.</param>
public readonly record struct SpectralSeaState(
    double Hm0,
    double EnergyPeriod,
    double PeakPeriod,
    double Power,
    double ParametricPower,
    double SpectralWidth,
    double MeanDirectionFrom,
    double DirectionalSpread,
    double Directionality,
    double MaximumPowerFrom);
