namespace Atlas.WavePhysics.Tests;

public class DirectionalityTests
{
    // tests/data/physics/directionality_quad.csv: scipy.integrate.quad of the cosine-2s model over the forward half
    // plane. Absolute tolerance 1e-10.
    [Fact]
    public void CoefficientMatchesQuadratureOfTheCosineSpreadingModel()
    {
        foreach (var row in ReferenceTable.Read("directionality_quad.csv"))
        {
            Assert.Equal(row["s"], Directionality.SpreadingExponentFromSpread(row["spread_deg"]), 1e-9 * row["s"]);
            Assert.Equal(row["d"], Directionality.CoefficientFromSpread(row["spread_deg"]), 1e-10);
        }
    }

    // Limits (analytic): no spread puts all power in one direction (d = 1); the isotropic sea resolves
    // integral (1/2pi) max(cos phi, 0) dphi = 1/pi in any direction.
    [Fact]
    public void NoSpreadGivesOneAndIsotropicSpreadGivesOneOverPi()
    {
        Assert.Equal(1.0, Directionality.CoefficientFromSpread(0), 1e-15);
        Assert.Equal(1 / Math.PI, Directionality.CoefficientFromSpread(Directionality.IsotropicSpreadDegrees), 1e-12);
        Assert.Equal(1 / Math.PI, Directionality.CoefficientFromSpread(120), 1e-15);
        Assert.True(double.IsNaN(Directionality.CoefficientFromSpread(double.NaN)));
        Assert.Throws<ArgumentOutOfRangeException>(() => Directionality.CoefficientFromSpread(-1));
    }

    // Analytic cases of J_theta = sum P_k max(cos(theta - theta_k), 0): one component, d = 1; two equal opposed
    // components, d = 1/2; two equal components at right angles, max of cos t + sin t = sqrt 2 at 45 degrees, d = sqrt(2)/2.
    [Fact]
    public void ComponentCasesGiveTheirAnalyticCoefficients()
    {
        Assert.Equal(1.0, Directionality.FromComponents([5.0], [250.0]).Coefficient, 1e-15);
        Assert.Equal(0.5, Directionality.FromComponents([3.0, 3.0], [10.0, 190.0]).Coefficient, 1e-15);
        DirectionalPower rightAngle = Directionality.FromComponents([2.0, 2.0], [350.0, 80.0]);
        Assert.Equal(Math.Sqrt(2) / 2, rightAngle.Coefficient, 1e-14);
        Assert.Equal(35.0, rightAngle.DirectionOfMaximumDegrees, 1e-9);
        Assert.True(double.IsNaN(Directionality.FromComponents([], []).Coefficient));
    }

    // A directional spectrum built from the model (JONSWAP times cosine-2s, 720 direction bins) must give back the
    // model coefficient (the same quantity two ways; 1e-5 for the direction discretisation), its maximum along the
    // mean direction, and the omnidirectional power of the frequency spectrum.
    [Theory]
    [InlineData(15.0, 275.0)]
    [InlineData(30.0, 10.0)]
    [InlineData(60.0, 180.0)]
    public void DirectionalSpectrumOfTheModelGivesTheModelCoefficient(double spread, double meanDirection)
    {
        var f = Enumerable.Range(40, 500).Select(i => i / 1000.0).ToArray();
        double[] s = JonswapSpectrum.Density(f, 2.0, 9.0);
        const int bins = 720;
        double[] directions = Enumerable.Range(0, bins).Select(j => j * 360.0 / bins).ToArray();
        double exponent = Directionality.SpreadingExponentFromSpread(spread);
        var density = new double[f.Length * bins];
        for (int j = 0; j < bins; j++)
        {
            double d = Directionality.SpreadingDensity((directions[j] - meanDirection) * Math.PI / 180, exponent);
            for (int i = 0; i < f.Length; i++) density[i * bins + j] = s[i] * d;
        }

        DirectionalPower result = Directionality.FromDirectionalSpectrum(f, directions, density, 25.0);
        Assert.Equal(Directionality.CoefficientFromSpread(spread), result.Coefficient, 1e-5);
        Assert.Equal(0, Math.IEEERemainder(result.DirectionOfMaximumDegrees - meanDirection, 360), 0.5);
        double omnidirectional = SpectralMoments.Parameters(f, s, 25.0).PowerKilowattsPerMetre;
        Assert.Equal(omnidirectional, result.OmnidirectionalPower, 1e-6 * omnidirectional);
    }

    [Fact]
    public void SpreadAndExponentRoundTrip()
    {
        foreach (double spread in new[] { 5.0, 22.0, 47.5, 80.0 })
            Assert.Equal(spread, Directionality.SpreadFromSpreadingExponent(Directionality.SpreadingExponentFromSpread(spread)), 1e-10);
    }

    [Fact]
    public void UnevenDirectionBinsThrowNamingThem()
    {
        var error = Assert.Throws<ArgumentException>(() =>
            Directionality.FromDirectionalSpectrum([0.1, 0.2], [0.0, 100.0, 240.0], new double[6], double.NaN));
        Assert.Contains("Directions 0 and 1", error.Message);
    }
}
