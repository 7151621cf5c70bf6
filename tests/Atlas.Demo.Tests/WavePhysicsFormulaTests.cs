namespace Atlas.Demo.Tests;

public class WavePhysicsFormulaTests
{
    // USACE Shore Protection Manual (1984), Appendix C, Table C-1, recalled from memory (see
    // tests/data/README.md): h/L0, tanh(kh), n = cg/c. The model uses the explicit
    // Fenton and McKee (1990) wavelength, good to about 1.5 %; the tolerance is 2 %.
    [Theory]
    [InlineData(0.01, 0.24804, 0.97923)]
    [InlineData(0.05, 0.53104, 0.89993)]
    [InlineData(0.10, 0.70932, 0.81025)]
    [InlineData(0.20, 0.88843, 0.66771)]
    [InlineData(0.50, 0.99636, 0.51151)]
    public void ShoalingFactorsFollowTheShoreProtectionManualTable(double depthOverDeepWaterLength, double tanhKh, double n)
    {
        const double period = 10.0;
        double l0 = ShoalingTable.Gravity * period * period / (2 * Math.PI);
        (double speedRatio, double shoaling) = ShoalingTable.Factors(depthOverDeepWaterLength * l0, period);
        Assert.Equal(tanhKh, speedRatio, tanhKh * 0.02);
        // Ks = sqrt(cg0 / cg) = sqrt(1 / (2 n tanh kh)) from the same table row.
        double expectedShoaling = Math.Sqrt(1.0 / (2 * n * tanhKh));
        Assert.Equal(expectedShoaling, shoaling, expectedShoaling * 0.02);
    }

    [Fact]
    public void ShoalingCoefficientIsOneInDeepWater()
    {
        // Deep water (h/L0 = 2): cg = cg0, so Ks = 1 (linear theory); tolerance 1e-5, the
        // approximation's own residual there being about 2e-6.
        (double ratio, double ks) = ShoalingTable.Factors(2 * 1.5613 * 64, 8.0);
        Assert.Equal(1.0, ratio, 1e-5);
        Assert.Equal(1.0, ks, 1e-5);
    }

    [Fact]
    public void FetchLimitedWindSeaFollowsTheJonswapGrowthLaws()
    {
        // JONSWAP (Hasselmann et al. 1973), from memory: g Hm0 / U^2 = 1.6e-3 (g F / U^2)^(1/2),
        // g Tp / U = 0.286 (g F / U^2)^(1/3). U = 10 m/s, F = 50 km: g F / U^2 = 4905,
        // Hm0 = 1.6e-3 * 70.04 * 10.194 = 1.142 m, Tp = 0.286 * 16.99 * 1.0194 = 4.954 s.
        (double hs, double tp, double te, _) = WindSeaGrowth.Grow(10.0, 50.0);
        Assert.Equal(1.142, hs, 0.005);
        Assert.Equal(4.954, tp, 0.005);
        // Young sea: Te / Tp between the JONSWAP 0.9 and Pierson-Moskowitz 0.857 (IEC TS 62600-101, from memory).
        Assert.InRange(te / tp, 0.857, 0.9);
    }

    [Fact]
    public void OpenOceanWindSeaStopsAtThePiersonMoskowitzLimit()
    {
        // Pierson and Moskowitz (1964), from memory: fully developed g Hm0 / U^2 = 0.21 and
        // omega_p U / g = 0.877. U = 15 m/s: Hm0 = 0.21 * 225 / 9.81 = 4.817 m, Tp = 2 pi 15 / (0.877 g) = 10.955 s.
        (double hs, double tp, double te, double spread) = WindSeaGrowth.Grow(15.0, FetchRays.OpenOceanKm);
        Assert.Equal(4.817, hs, 0.005);
        Assert.Equal(10.955, tp, 0.005);
        Assert.Equal(0.857, te / tp, 0.002);
        // A fully developed sea is still wider in direction than the model's swells (at most 30 degrees).
        Assert.True(spread >= 30.0, $"spread {spread}");
    }

    [Fact]
    public void CombinedEnergyPeriodIsTheEnergyWeightedMeanOfTheSystems()
    {
        // Te = m-1 / m0 and both moments add over systems (IEC TS 62600-101 definition), so
        // Te = (H1^2 Te1 + H2^2 Te2) / (H1^2 + H2^2); Hm0 = 4 sqrt(m0) gives Hs = sqrt(H1^2 + H2^2).
        // 2 m at Te 9 s and 1 m at Te 5 s: Te = (36 + 5) / 5 = 8.2 s, Hs = 2.2361 m.
        var mix = new SeaStateMix();
        mix.Add(2.0, 10.0, 9.0, 270.0, 20.0);
        mix.Add(1.0, 6.0, 5.0, 270.0, 35.0);
        (double hs, double tp, double te, double from, _) = mix.Result();
        Assert.Equal(2.2361, hs, 1e-4);
        Assert.Equal(8.2, te, 1e-9);
        Assert.Equal(10.0, tp);
        Assert.Equal(270.0, from, 1e-9);
    }

    [Fact]
    public void CrossingSeasWidenTheCombinedSpread()
    {
        var single = new SeaStateMix();
        single.Add(2.0, 10.0, 9.0, 260.0, 20.0);
        var crossing = single;
        crossing.Add(1.5, 6.0, 5.2, 330.0, 30.0);
        Assert.True(crossing.Result().SpreadDegrees > single.Result().SpreadDegrees + 10.0);
        Assert.Equal(20.0, single.Result().SpreadDegrees, 0.5);
    }

    [Fact]
    public void EmptyMixGivesNaN()
    {
        var mix = new SeaStateMix();
        mix.Add(0.0, 10.0, 9.0, 270.0, 20.0);
        Assert.True(double.IsNaN(mix.Result().Hs));
    }

    [Fact]
    public void DevicePowerMatrixUsesTheDeepWaterPowerCoefficient()
    {
        // IEC TS 62600-101 (from memory): J = rho g^2 Hm0^2 Te / (64 pi) = 0.4906 Hm0^2 Te kW/m.
        Assert.Equal(0.4906, DevicePowerMatrix.DeepWaterPowerCoefficient, 1e-4);
    }

    [Theory]
    [InlineData(12.3456f)]
    [InlineData(0.0123456f)]
    [InlineData(359.98f)]
    public void SignificantBitRoundingKeepsTheRelativeErrorBelowHalfAUnitInTheLastKeptBit(float value)
    {
        Span<float> values = [value, -999f, float.NaN];
        SignificantBitRounding.Round(values, 12);
        // 12 kept bits: |error| <= 2^-13 relative (IEEE 754 binary32 layout).
        Assert.InRange(Math.Abs(values[0] - value) / value, 0.0, Math.Pow(2, -13));
        Assert.Equal(0u, BitConverter.SingleToUInt32Bits(values[0]) & ((1u << 11) - 1));
        Assert.Equal(-999f, values[1]);
        Assert.True(float.IsNaN(values[2]));
    }
}
