using static Atlas.WavePhysics.Tests.DispersionRelationTests;

namespace Atlas.WavePhysics.Tests;

public class SpectralMomentsTests
{
    private static double[] Frequencies(int first, int last, double scale)
    {
        var f = new double[last - first + 1];
        for (int i = 0; i < f.Length; i++) f[i] = (first + i) / scale;
        return f;
    }

    // tests/data/physics/jonswap_parameters.csv: the same spectrum integrated by numpy.trapz, with brentq group
    // velocities (IEC TS 62600-101 definitions). Same rule on the same grid, so relative tolerance 1e-10
    // (power: 1e-9, the group velocities come from two root finders).
    [Fact]
    public void ParametersOfJonswapSpectrumMatchNumPyIntegration()
    {
        var reference = ReferenceTable.ReadQuantities("jonswap_parameters.csv");
        double[] f = Frequencies(20, 1000, 1000.0);
        double[] s = JonswapSpectrum.Density(f, 2.0, 10.0, 3.3);

        SpectrumParameters p = SpectralMoments.Parameters(f, s, 20.0);
        AssertRelative(reference["m0"], p.M0, 1e-10);
        AssertRelative(reference["m_minus1"], p.MMinus1, 1e-10);
        AssertRelative(reference["m1"], p.M1, 1e-10);
        AssertRelative(reference["m2"], p.M2, 1e-10);
        AssertRelative(reference["hm0"], p.Hm0, 1e-10);
        AssertRelative(reference["te"], p.EnergyPeriod, 1e-10);
        AssertRelative(reference["tm01"], p.MeanPeriod, 1e-10);
        AssertRelative(reference["tm02"], p.ZeroCrossingPeriod, 1e-10);
        AssertRelative(reference["tp"], p.PeakPeriod, 1e-12);
        AssertRelative(reference["eps0"], p.SpectralWidth, 1e-9);
        AssertRelative(reference["power_kw_per_m_depth_20"], p.PowerKilowattsPerMetre, 1e-9);
        AssertRelative(reference["power_kw_per_m_depth_deep"], SpectralMoments.Parameters(f, s).PowerKilowattsPerMetre, 1e-9);
    }

    // In deep water cg = g / (4 pi f), so the spectral power is rho g^2 m-1 / (4 pi) = rho g^2 Hm0^2 Te / (64 pi) for
    // any spectrum (IEC TS 62600-101): the spectral and bulk formulas must agree to rounding.
    [Theory]
    [InlineData(1.0)]
    [InlineData(3.3)]
    [InlineData(7.0)]
    public void DeepWaterSpectralPowerEqualsTheBulkFormula(double gamma)
    {
        double[] f = Frequencies(30, 3000, 2000.0);
        double[] s = JonswapSpectrum.Density(f, 3.0, 11.0, gamma);
        SpectrumParameters p = SpectralMoments.Parameters(f, s, double.PositiveInfinity);
        AssertRelative(WavePower.DeepWaterPower(p.Hm0, p.EnergyPeriod), p.PowerKilowattsPerMetre, 1e-12);
    }

    // DNV-RP-C205 (from memory): with A = 1 - 0.287 ln gamma, 4 sqrt(m0) stays within about 1 % of the requested Hs for
    // gamma between 1 and 7; gamma = 1 is Pierson-Moskowitz, whose m0 is Hs^2/16 exactly (analytic integral), here to
    // the 1e-5 the finite frequency range allows.
    [Theory]
    [InlineData(1.0, 1e-5)]
    [InlineData(2.0, 0.01)]
    [InlineData(3.3, 0.01)]
    [InlineData(5.0, 0.01)]
    [InlineData(7.0, 0.01)]
    public void JonswapSpectrumIntegratesToTheRequestedHs(double gamma, double tolerance)
    {
        double[] f = Frequencies(10, 6000, 2000.0);
        double[] s = JonswapSpectrum.Density(f, 2.0, 10.0, gamma);
        AssertRelative(2.0, SpectralMoments.Parameters(f, s).Hm0, tolerance);
    }

    // Te / Tp: 0.9 for JONSWAP gamma 3.3 (IEC TS 62600-101, common practice; numerically 0.903) within 0.005, and the
    // analytic Pierson-Moskowitz value 1.25^(-1/4) Gamma(5/4) = 0.857222537 (scipy.special.gamma) within 2e-6.
    [Fact]
    public void EnergyToPeakPeriodRatiosOfSpectraMatchTheConversionRatios()
    {
        double[] f = Frequencies(10, 8000, 2000.0);
        SpectrumParameters jonswap = SpectralMoments.Parameters(f, JonswapSpectrum.Density(f, 2.0, 10.0, 3.3));
        SpectrumParameters pm = SpectralMoments.Parameters(f, JonswapSpectrum.Density(f, 2.0, 10.0, 1.0));
        Assert.Equal(10.0, jonswap.PeakPeriod, 1e-9);
        Assert.Equal(PeriodConversion.EnergyToPeakPeriodRatio(SpectrumShape.JonswapGamma33), jonswap.EnergyPeriod / jonswap.PeakPeriod, 0.005);
        Assert.Equal(0.857222537, pm.EnergyPeriod / pm.PeakPeriod, 2e-6);
        Assert.Equal(0.857222537, PeriodConversion.EnergyToPeakPeriodRatio(SpectrumShape.PiersonMoskowitz), 0.0003);
        Assert.Equal(9.0, PeriodConversion.EnergyPeriodFromPeakPeriod(10.0), 1e-12);
    }

    // Pierson-Moskowitz spectral width from the analytic moments m_n ~ Gamma(1 - n/4): eps0 = sqrt(Gamma(1.5) / Gamma(1.25)^2 - 1)
    // = 0.2805445 (scipy.special.gamma), within 1e-4 (finite frequency range).
    [Fact]
    public void PiersonMoskowitzSpectralWidthMatchesTheAnalyticValue()
    {
        double[] f = Frequencies(10, 8000, 2000.0);
        SpectrumParameters pm = SpectralMoments.Parameters(f, JonswapSpectrum.Density(f, 2.0, 10.0, 1.0));
        Assert.Equal(0.2805445, pm.SpectralWidth, 1e-4);
    }

    [Fact]
    public void MalformedSpectrumThrowsNamingTheProblem()
    {
        var e1 = Assert.Throws<ArgumentException>(() => SpectralMoments.Moment([0.1, 0.2], [1.0], 0));
        Assert.Contains("2 frequencies but 1 densities", e1.Message);
        var e2 = Assert.Throws<ArgumentException>(() => SpectralMoments.Moment([0.1, 0.1], [1.0, 1.0], 0));
        Assert.Contains("does not increase", e2.Message);
        var e3 = Assert.Throws<ArgumentException>(() => SpectralMoments.Moment([0.1, 0.2], [1.0, -1.0], 0));
        Assert.Contains("Density 1", e3.Message);
    }
}
