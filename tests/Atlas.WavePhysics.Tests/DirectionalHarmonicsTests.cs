namespace Atlas.WavePhysics.Tests;

public class DirectionalHarmonicsTests
{
    private static double[] Sums(params (double Power, double DirectionDegrees, double SpreadDegrees)[] steps)
    {
        var sums = new double[DirectionalHarmonics.SumLength];
        var moments = new double[DirectionalHarmonics.Orders];
        foreach (var (power, direction, spread) in steps)
        {
            DirectionalHarmonics.SpreadingMoments(spread, moments);
            (double sin, double cos) = Math.SinCos(direction * Math.PI / 180);
            DirectionalHarmonics.Add(sums, power, cos, sin, moments);
        }
        return sums;
    }

    // tests/data/README.md (SciPy quad of the cosine-2s model, from memory): spread 10, 30, 60 degrees give d = 0.98477,
    // 0.86324, 0.53832 (five decimals). One step's harmonics resolve its power along its own mean direction.
    [Theory]
    [InlineData(10, 0.98477)]
    [InlineData(30, 0.86324)]
    [InlineData(60, 0.53832)]
    public void OneStepGivesTheQuadratureCoefficientAlongItsMeanDirection(double spread, double expected)
    {
        DirectionalPower power = DirectionalHarmonics.Maximum(Sums((12.5, 255, spread)));
        Assert.Equal(expected, power.Coefficient, 5e-6);
        Assert.Equal(255, power.DirectionOfMaximumDegrees, 1e-6);
        Assert.Equal(12.5, power.OmnidirectionalPower, 1e-12);
    }

    // tests/data/physics/directionality_quad.csv (scipy.integrate.quad of the same model): the truncated series stays
    // within its stated error, 5e-6 from 5 degrees of spread (and 2e-4 below, down to 2 degrees).
    [Fact]
    public void HarmonicSeriesMatchesQuadratureOfTheCosineSpreadingModel()
    {
        foreach (var row in ReferenceTable.Read("directionality_quad.csv"))
        {
            double spread = row["spread_deg"];
            if (spread < 2) continue;
            double tolerance = spread >= 5 ? 5e-6 : 2e-4;
            Assert.Equal(row["d"], DirectionalHarmonics.Maximum(Sums((1, 10, spread))).Coefficient, tolerance);
        }
    }

    // The table of moments over sigma^2 against the recurrence: the coefficient agrees within its stated 1e-5.
    [Fact]
    public void TabulatedMomentsStayWithinTheirStatedError()
    {
        var exact = new double[DirectionalHarmonics.Orders];
        var tabulated = new double[DirectionalHarmonics.Orders];
        for (double spread = 0.5; spread <= 95; spread += 0.0173)
        {
            DirectionalHarmonics.SpreadingMoments(spread, exact);
            DirectionalHarmonics.SpreadingMomentsTabulated(spread, tabulated);
            var a = new double[DirectionalHarmonics.SumLength];
            var b = new double[DirectionalHarmonics.SumLength];
            DirectionalHarmonics.Add(a, 1, 1, 0, exact);
            DirectionalHarmonics.Add(b, 1, 1, 0, tabulated);
            Assert.Equal(DirectionalHarmonics.ResolvedPower(a, 0), DirectionalHarmonics.ResolvedPower(b, 0), spread >= 10 ? 5e-8 : 1e-5);
        }
    }

    // Analytic (J_theta = integral of D(phi) max(cos(theta - phi), 0)): two equal, narrow seas from opposite sides
    // resolve half the power each way, d = d(narrow) / 2; an isotropic sea resolves 1/pi in every direction.
    [Fact]
    public void OpposedSeasHalveTheCoefficientAndAnIsotropicSeaGivesOneOverPi()
    {
        double single = Directionality.CoefficientFromSpread(15);
        DirectionalPower opposed = DirectionalHarmonics.Maximum(Sums((3, 90, 15), (3, 270, 15)));
        Assert.Equal(single / 2, opposed.Coefficient, 1e-6);
        DirectionalPower isotropic = DirectionalHarmonics.Maximum(Sums((5, 40, 85)));
        Assert.Equal(1 / Math.PI, isotropic.Coefficient, 1e-12);
    }

    // Energetic steps weigh more (IEC TS 62600-101: the period coefficient is from period means of J_theta and J):
    // a calm, broad sea (1 kW/m, spread 60) and an energetic, narrow one (99 kW/m, spread 20, from 250 degrees).
    // The period coefficient is near the energetic one, where the time mean of the two per-step values is not.
    [Fact]
    public void EnergeticStepsWeighMoreThanCalmOnes()
    {
        DirectionalPower period = DirectionalHarmonics.Maximum(Sums((1, 300, 60), (99, 250, 20)));
        double energetic = Directionality.CoefficientFromSpread(20), calm = Directionality.CoefficientFromSpread(60);
        Assert.Equal(energetic, period.Coefficient, 0.01);
        Assert.True(Math.Abs(period.Coefficient - (energetic + calm) / 2) > 0.15);
        Assert.Equal(250, period.DirectionOfMaximumDegrees, 1.0);
    }

    [Fact]
    public void NoPowerGivesNaNAndBadSpreadIsRefused()
    {
        DirectionalPower nothing = DirectionalHarmonics.Maximum(new double[DirectionalHarmonics.SumLength]);
        Assert.True(double.IsNaN(nothing.Coefficient) && double.IsNaN(nothing.DirectionOfMaximumDegrees));
        Assert.Throws<ArgumentOutOfRangeException>(() => DirectionalHarmonics.SpreadingMoments(-1, new double[DirectionalHarmonics.Orders]));
    }

    // The vectorised wide layout of the streaming pass adds what the plain one adds with the tabulated moments.
    [Fact]
    public void WideLayoutAddsWhatThePlainOneAdds()
    {
        var random = new Random(5);
        var wide = new double[DirectionalHarmonics.WideLength];
        var accumulator = new HarmonicAccumulator();
        var plain = new double[DirectionalHarmonics.SumLength];
        var moments = new double[DirectionalHarmonics.Orders];
        for (int k = 0; k < 500; k++)
        {
            double power = 40 * random.NextDouble(), direction = 360 * random.NextDouble(), spread = 90 * random.NextDouble();
            (double sin, double cos) = Math.SinCos(direction * Math.PI / 180);
            accumulator.Add(power, cos, sin, spread);
            if (k % 97 == 0) accumulator.MoveTo(wide); // runs of several steps, stored and forgotten
            DirectionalHarmonics.SpreadingMomentsTabulated(spread, moments);
            DirectionalHarmonics.Add(plain, power, cos, sin, moments);
        }
        accumulator.MoveTo(wide);
        var converted = new double[DirectionalHarmonics.SumLength];
        DirectionalHarmonics.WideToSums(wide, 1, converted);
        for (int i = 0; i < plain.Length; i++) Assert.Equal(plain[i], converted[i], 1e-9 * Math.Abs(plain[0]));
    }
}
