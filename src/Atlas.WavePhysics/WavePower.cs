using System.Runtime.CompilerServices;
using System.Runtime.Intrinsics;

namespace Atlas.WavePhysics;

/// <summary>
/// Omnidirectional wave power per unit crest length from sea-state parameters, for one time step.
/// </summary>
/// <remarks>
/// J = rho g cg(Te, h) m0 with m0 = Hm0^2 / 16, i.e. the energy density E = rho g Hm0^2 / 16 carried at the
/// group velocity of a linear wave of the energy period Te at the depth h (IEC TS 62600-101). In deep water
/// cg = g Te / (4 pi) and the same formula reduces to J = rho g^2 Hm0^2 Te / (64 pi) = 0.4906 Hm0^2 Te kW/m.
/// Power is computed per step and averaged afterwards, never from mean Hm0 and mean Te.
/// </remarks>
public static class WavePower
{
    /// <summary>rho g^2 / (64 pi) / 1000: deep-water power in kW/m per m^2 of Hm0^2 per s of Te (0.49060).</summary>
    public const double DeepWaterCoefficient =
        PhysicalConstants.SeawaterDensity * PhysicalConstants.Gravity * PhysicalConstants.Gravity / (64 * Math.PI) / 1000.0;

    /// <summary>Energy density E = rho g Hm0^2 / 16, J/m^2.</summary>
    public static double EnergyDensity(double hm0Metres) =>
        PhysicalConstants.SeawaterDensity * PhysicalConstants.Gravity * hm0Metres * hm0Metres / 16.0;

    /// <summary>
    /// Omnidirectional power J (kW/m) from Hm0 (m), Te (s) and depth (m), using the exact dispersion solver.
    /// </summary>
    /// <param name="hm0Metres">Spectral significant wave height, m. NaN gives NaN.</param>
    /// <param name="energyPeriodSeconds">Energy period Tm-1,0, s, positive. NaN gives NaN.</param>
    /// <param name="depthMetres">Depth, m; NaN or +infinity means deep water; zero or negative throws.</param>
    public static double OmnidirectionalPower(double hm0Metres, double energyPeriodSeconds, double depthMetres)
    {
        if (double.IsNaN(hm0Metres) || double.IsNaN(energyPeriodSeconds)) return double.NaN;
        double cg = DispersionRelation.GroupVelocity(energyPeriodSeconds, depthMetres);
        return EnergyDensity(hm0Metres) * cg / 1000.0;
    }

    /// <summary>Deep-water power J = 0.4906 Hm0^2 Te (kW/m): the deep limit of <see cref="OmnidirectionalPower(double, double, double)"/>.</summary>
    public static double DeepWaterPower(double hm0Metres, double energyPeriodSeconds) =>
        DeepWaterCoefficient * hm0Metres * hm0Metres * energyPeriodSeconds;

    /// <summary>
    /// Power for a whole series at one depth through the tabulated group velocity: the fast path of the
    /// statistics pass (a few nanoseconds a step, relative error below <see cref="GroupVelocityTable.MaxRelativeError"/>).
    /// </summary>
    /// <param name="hm0Metres">Hm0 per step, m.</param>
    /// <param name="energyPeriodSeconds">Te per step, s; same length as <paramref name="hm0Metres"/>.</param>
    /// <param name="table">Group velocity at the cell depth.</param>
    /// <param name="powerKilowattsPerMetre">Receives J per step, kW/m. A step whose Hm0 is NaN or negative, or whose
    /// Te is NaN, zero or negative, gets NaN (a missing step).</param>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static void OmnidirectionalPower(ReadOnlySpan<float> hm0Metres, ReadOnlySpan<float> energyPeriodSeconds,
        in GroupVelocityTable table, Span<float> powerKilowattsPerMetre)
    {
        if (energyPeriodSeconds.Length != hm0Metres.Length)
            throw new ArgumentException($"Te has {energyPeriodSeconds.Length} steps but Hm0 has {hm0Metres.Length}.", nameof(energyPeriodSeconds));
        if (powerKilowattsPerMetre.Length < hm0Metres.Length)
            throw new ArgumentException($"The output holds {powerKilowattsPerMetre.Length} steps but {hm0Metres.Length} are needed.", nameof(powerKilowattsPerMetre));

        if (table.IsDeepWater)
        {
            for (int i = DeepWaterVectors(hm0Metres, energyPeriodSeconds, powerKilowattsPerMetre); i < hm0Metres.Length; i++)
            {
                double h = hm0Metres[i], t = energyPeriodSeconds[i];
                powerKilowattsPerMetre[i] = h >= 0 && t > 0 ? (float)(DeepWaterCoefficient * h * h * t) : float.NaN;
            }
            return;
        }
        for (int i = 0; i < hm0Metres.Length; i++)
        {
            double h = hm0Metres[i], t = energyPeriodSeconds[i];
            powerKilowattsPerMetre[i] = h >= 0 && t > 0
                ? (float)(DeepWaterCoefficient * h * h * t * table.DeepWaterRatio(t))
                : float.NaN;
        }
    }
    /// <summary>
    /// The leading whole vectors of the deep-water loop of <see cref="OmnidirectionalPower(ReadOnlySpan{float}, ReadOnlySpan{float}, in GroupVelocityTable, Span{float})"/>:
    /// the same operations in the same order lane by lane (C Hm0 Hm0 Te in double, rounded to single), so the same bits.
    /// Returns the steps done; the caller does the rest.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static int DeepWaterVectors(ReadOnlySpan<float> hm0Metres, ReadOnlySpan<float> energyPeriodSeconds, Span<float> powerKilowattsPerMetre)
    {
        if (!Vector256.IsHardwareAccelerated) return 0;
        var coefficient = Vector256.Create(DeepWaterCoefficient);
        var missing = Vector256.Create(float.NaN);
        int lanes = Vector256<float>.Count, i = 0;
        for (; i + lanes <= hm0Metres.Length; i += lanes)
        {
            var h = Vector256.Create(hm0Metres.Slice(i, lanes));
            var t = Vector256.Create(energyPeriodSeconds.Slice(i, lanes));
            var (hLower, hUpper) = Vector256.Widen(h);
            var (tLower, tUpper) = Vector256.Widen(t);
            var power = Vector256.Narrow(coefficient * hLower * hLower * tLower, coefficient * hUpper * hUpper * tUpper);
            var valid = Vector256.GreaterThanOrEqual(h, Vector256<float>.Zero) & Vector256.GreaterThan(t, Vector256<float>.Zero);
            Vector256.ConditionalSelect(valid, power, missing).CopyTo(powerKilowattsPerMetre.Slice(i, lanes));
        }
        return i;
    }
}
