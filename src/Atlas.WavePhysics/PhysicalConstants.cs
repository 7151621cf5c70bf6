namespace Atlas.WavePhysics;

/// <summary>
/// The constants every formula in this library uses, so that deep-water and finite-depth power come out of
/// the same numbers (IEC TS 62600-101 takes rho = 1025 kg/m3 and g = 9.81 m/s2).
/// </summary>
public static class PhysicalConstants
{
    /// <summary>Sea-water density, kg/m3.</summary>
    public const double SeawaterDensity = 1025.0;

    /// <summary>Acceleration due to gravity, m/s2.</summary>
    public const double Gravity = 9.81;
}
