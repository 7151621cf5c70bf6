using System.Globalization;
using static Atlas.WavePhysics.Tests.DispersionRelationTests;

namespace Atlas.WavePhysics.Tests;

public class SpectralIntegratorTests
{
    private static readonly double[] GeometricFrequencies = Enumerable.Range(0, 32).Select(i => 0.035 * Math.Pow(1.1, i)).ToArray();
    private static readonly double[] Directions15 = Enumerable.Range(0, 24).Select(j => 7.5 + 15.0 * j).ToArray();

    private static float[] DensityFromCsv()
    {
        string path = Path.Combine(AppContext.BaseDirectory, "data", "physics", "directional_spectrum_density.csv");
        return File.ReadAllLines(path).Where(l => l.Length > 0)
            .SelectMany(l => l.Split(',').Select(c => (float)double.Parse(c, CultureInfo.InvariantCulture))).ToArray();
    }

    // tests/data/physics/directional_spectrum_parameters.csv (make_references.py): the same discrete JONSWAP x cosine-2s
    // spectrum integrated by numpy.trapz over frequency, with cg from scipy.optimize.brentq roots of the dispersion
    // relation at each frequency, and J_theta maximised by a 0.001-degree grid then scipy.optimize.minimize_scalar.
    // The densities pass through float32 here (as files store them), so tolerances are 1e-6 relative.
    [Theory]
    [InlineData(15.0, "15")]
    [InlineData(double.NaN, "deep")]
    public void DirectionalSpectrumMatchesNumPyAndSciPy(double depth, string name)
    {
        var reference = ReferenceTable.ReadQuantities("directional_spectrum_parameters.csv");
        var integrator = new SpectralIntegrator(new SpectralAxes(GeometricFrequencies, Directions15), depth);
        SpectralSeaState state = integrator.Integrate(DensityFromCsv());

        AssertRelative(reference["hm0"], state.Hm0, 1e-6);
        AssertRelative(reference["te"], state.EnergyPeriod, 1e-6);
        AssertRelative(reference["tp"], state.PeakPeriod, 1e-12);
        AssertRelative(reference["eps0"], state.SpectralWidth, 1e-5);
        Assert.Equal(reference["mean_dir_from"], state.MeanDirectionFrom, 1e-4);
        Assert.Equal(reference["spread_deg"], state.DirectionalSpread, 1e-4);
        AssertRelative(reference[$"power_{name}"], state.Power, 1e-6);
        AssertRelative(reference[$"parametric_power_{name}"], state.ParametricPower, 1e-6);
        AssertRelative(reference[$"directionality_{name}"], state.Directionality, 1e-6);
        Assert.Equal(reference[$"max_power_from_{name}"], state.MaximumPowerFrom, 1e-4);
        Assert.Equal(reference[$"power_{name}"], integrator.DirectionPowers.ToArray().Sum(), 1e-6 * state.Power);
    }

    // A shallow point where spectral and parametric power differ by several percent, a deep one where they agree
    // (IEC TS 62600-101: in deep water cg = g / (4 pi f), so both reduce to rho g^2 m-1 / (4 pi)).
    [Fact]
    public void SpectralAndParametricPowerDifferInShallowWaterAndAgreeInDeep()
    {
        var axes = new SpectralAxes(GeometricFrequencies, Directions15);
        var density = DensityFromCsv();
        var shallow = new SpectralIntegrator(axes, 15).Integrate(density);
        var deep = new SpectralIntegrator(axes, double.NaN).Integrate(density);
        double shallowGap = shallow.ParametricPower / shallow.Power - 1;
        Assert.InRange(shallowGap, 0.03, 0.06);
        Assert.Equal(1.0, deep.ParametricPower / deep.Power, 1e-9);
    }

    // Pierson-Moskowitz (alpha = 0.0081, Te/Tp = 0.857) and JONSWAP gamma 3.3 (Te/Tp about 0.90): the ratios of
    // common practice quoted in ../shared/REFERENCES.md, and Hm0 recovered from the Hs the analytic spectrum is built
    // for (DNV-RP-C205 normalisation, which is approximate for JONSWAP: within 1 %). Fine grid to 2 Hz.
    [Theory]
    [InlineData(1.0, 0.857, 0.002)]
    [InlineData(3.3, 0.90, 0.01)]
    public void AnalyticSpectraGiveTheirKnownPeriodRatios(double gamma, double ratio, double tolerance)
    {
        double[] f = Enumerable.Range(0, 4000).Select(i => 0.02 + 0.0005 * i).ToArray();
        double[] s = JonswapSpectrum.Density(f, 3.0, 12.0, gamma);
        var state = new SpectralIntegrator(new SpectralAxes(f, []), double.NaN).Integrate(s.Select(v => (float)v).ToArray());
        Assert.Equal(ratio, state.EnergyPeriod / 12.0, tolerance);
        // The grid has no frequency at exactly 1/12 Hz: the nearest, 0.0835 Hz, is the discrete peak.
        Assert.Equal(1 / 0.0835, state.PeakPeriod, 1e-9);
        Assert.InRange(state.Hm0, 3.0 * 0.99, 3.0 * 1.01);
        Assert.True(double.IsNaN(state.Directionality));
    }

    // cos-2s spreading on 360 one-degree bins, the same at every frequency: d tends to the quadrature values of
    // ../shared/REFERENCES.md (SciPy quad: sigma 10 deg -> 0.98477, 30 deg -> 0.86324, 60 deg -> 0.53832), within the
    // discretisation of the bins.
    [Theory]
    [InlineData(10.0, 0.98477)]
    [InlineData(30.0, 0.86324)]
    [InlineData(60.0, 0.53832)]
    public void CosineSpreadingGivesTheReferenceDirectionality(double spreadDegrees, double expected)
    {
        double[] directions = Enumerable.Range(0, 360).Select(j => 0.5 + j).ToArray();
        double s = Directionality.SpreadingExponentFromSpread(spreadDegrees);
        double[] spreading = directions.Select(d => Directionality.SpreadingDensity((d - 200.5) * Math.PI / 180, s)).ToArray();
        double norm = spreading.Sum() * Math.PI / 180;
        double[] f = [0.05, 0.08, 0.1, 0.12, 0.2];
        double[] sf = [0.1, 1.0, 2.0, 1.0, 0.1];
        var density = new float[f.Length * 360];
        for (int i = 0; i < f.Length; i++)
            for (int j = 0; j < 360; j++) density[i * 360 + j] = (float)(sf[i] * spreading[j] / norm);
        var state = new SpectralIntegrator(new SpectralAxes(f, directions), 30).Integrate(density);
        Assert.Equal(expected, state.Directionality, 2e-4);
        // J_theta is flat near its maximum, so float32 densities move the direction of the maximum by tenths of a degree.
        Assert.Equal(200.5, state.MaximumPowerFrom, 0.5);
        Assert.Equal(spreadDegrees, state.DirectionalSpread, 0.05);
    }

    // The sweep gives the maximum that Directionality.FromComponents finds by evaluating every candidate afresh, for
    // 24 bins of 15 degrees, 36 of 10, 5 of 72 and 2 opposite bins (whose arcs are half the circle), and resolves it in a
    // direction where J_theta takes that value.
    [Theory]
    [InlineData(24)]
    [InlineData(36)]
    [InlineData(5)]
    [InlineData(2)]
    public void SweepAgreesWithTheCandidateSearch(int bins)
    {
        var random = new Random(7);
        double[] directions = Enumerable.Range(0, bins).Select(k => 360.0 * k / bins + 3).ToArray();
        var sweep = new ResolvedPowerSweep(directions);
        for (int trial = 0; trial < 500; trial++)
        {
            double[] powers = directions.Select(_ => random.NextDouble() < 0.3 ? 0 : random.NextDouble() * 10).ToArray();
            var expected = Directionality.FromComponents(powers, directions);
            var actual = sweep.Maximum(powers);
            if (double.IsNaN(expected.Coefficient)) { Assert.True(double.IsNaN(actual.Coefficient)); continue; }
            Assert.Equal(expected.MaximumResolvedPower, actual.MaximumResolvedPower, 1e-9 * expected.OmnidirectionalPower);
            double resolvedThere = powers.Select((p, k) => p * Math.Max(0, Math.Cos((actual.DirectionOfMaximumDegrees - directions[k]) * Math.PI / 180))).Sum();
            Assert.Equal(actual.MaximumResolvedPower, resolvedThere, 1e-9 * expected.OmnidirectionalPower);
        }
    }

    // However the circle is binned (a bin count that the vector path divides, and counts that leave a remainder), a
    // normalised spreading gives back the frequency spectrum it was built from: Hm0 = 4 sqrt(m0) by the trapezoidal rule,
    // and in deep water J = rho g sum_i w_i S(f_i) cg_i with the deep-water group velocity cg = g / (4 pi f) (textbook
    // linear wave theory; rho 1025 kg/m3, g 9.81 m/s2 as the atlas states).
    [Theory]
    [InlineData(24)]
    [InlineData(28)]
    [InlineData(36)]
    [InlineData(7)]
    public void AnyBinningGivesBackTheFrequencySpectrum(int bins)
    {
        double[] directions = Enumerable.Range(0, bins).Select(j => (0.5 + j) * 360.0 / bins).ToArray();
        double[] f = [0.05, 0.08, 0.1, 0.12, 0.2];
        double[] sf = [0.1, 1.0, 2.0, 1.0, 0.1];
        double[] w = [0.015, 0.025, 0.02, 0.05, 0.04];   // trapezoidal weights of f
        double[] spreading = directions.Select(d => Math.Pow(Math.Cos((d - 200) * Math.PI / 360), 8)).ToArray();
        double norm = spreading.Sum() * 2 * Math.PI / bins;
        var density = new float[f.Length * bins];
        for (int i = 0; i < f.Length; i++)
            for (int j = 0; j < bins; j++) density[i * bins + j] = (float)(sf[i] * spreading[j] / norm);
        var state = new SpectralIntegrator(new SpectralAxes(f, directions), double.NaN).Integrate(density);
        double m0 = f.Select((_, i) => w[i] * sf[i]).Sum();
        double power = 1025 * 9.81 * f.Select((x, i) => w[i] * sf[i] * 9.81 / (4 * Math.PI * x)).Sum() / 1000;
        AssertRelative(4 * Math.Sqrt(m0), state.Hm0, 1e-6);
        AssertRelative(power, state.Power, 1e-6);
    }

    [Fact]
    public void AxesThatAreNotUsableAreRefusedWithTheValue()
    {
        Assert.Contains("does not increase", Assert.Throws<ArgumentException>(() => new SpectralAxes([0.1, 0.1, 0.2], [])).Message);
        Assert.Contains("must cover the circle", Assert.Throws<ArgumentException>(() => new SpectralAxes([0.1, 0.2], [0, 15, 30, 45])).Message);
        Assert.Contains("[0, 360)", Assert.Throws<ArgumentException>(() => new SpectralAxes([0.1, 0.2], [-10, 110, 230])).Message);
        Assert.Contains("equal steps", Assert.Throws<ArgumentException>(() => new SpectralAxes([0.1, 0.2], [0, 90, 270])).Message);
    }

    [Fact]
    public void AMissingDensityGivesAMissingStep()
    {
        var integrator = new SpectralIntegrator(new SpectralAxes([0.1, 0.2], []), double.NaN);
        Assert.True(double.IsNaN(integrator.Integrate([1f, float.NaN]).Hm0));
        Assert.Equal(0, integrator.Integrate([0f, 0f]).Hm0);
    }
}
