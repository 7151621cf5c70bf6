namespace Atlas.WavePhysics.Tests;

public class DispersionRelationTests
{
    private const double Period = 8.0;

    private static double DepthFor(double depthOverDeepWaterWavelength) =>
        depthOverDeepWaterWavelength * DispersionRelation.DeepWaterWavelength(Period);

    // USACE Shore Protection Manual (1984), Appendix C, Table C-1, as quoted in tests/data/README.md (values from memory,
    // reproduced with SciPy brentq). Five significant figures are printed, so the tolerance is half a unit in the last place.
    [Theory]
    [InlineData(0.01, 0.04032, 0.24804, 0.97923)]
    [InlineData(0.05, 0.09415, 0.53104, 0.89993)]
    [InlineData(0.10, 0.14098, 0.70932, 0.81025)]
    [InlineData(0.20, 0.22512, 0.88843, 0.66771)]
    [InlineData(0.50, 0.50183, 0.99636, 0.51151)]
    public void ShoreProtectionManualTableRowsAreReproduced(double hOverL0, double hOverL, double tanhKh, double n)
    {
        double depth = DepthFor(hOverL0);
        LinearWave wave = DispersionRelation.Solve(Period, depth);
        Assert.Equal(hOverL, depth / wave.Wavelength, 5e-6);
        Assert.Equal(tanhKh, Math.Tanh(wave.RelativeDepth), 5e-6);
        Assert.Equal(n, wave.GroupToPhaseSpeedRatio, 5e-6);
    }

    // tests/data/physics/dispersion_brentq.csv: roots by scipy.optimize.brentq (xtol 1e-15); relative tolerance 1e-12.
    [Fact]
    public void SolverAgreesWithBrentRootsFromVeryShallowToDeepWater()
    {
        var rows = ReferenceTable.Read("dispersion_brentq.csv");
        Assert.True(rows.Count >= 40);
        foreach (var row in rows)
        {
            double depth = DepthFor(row["h_over_L0"]);
            LinearWave wave = DispersionRelation.Solve(Period, depth);
            AssertRelative(row["h_over_L"], depth / wave.Wavelength, 1e-12);
            AssertRelative(row["tanh_kh"], Math.Tanh(wave.RelativeDepth), 1e-12);
            AssertRelative(row["n"], wave.GroupToPhaseSpeedRatio, 1e-12);
            AssertRelative(row["cg_over_cg0"], wave.GroupVelocity / (PhysicalConstants.Gravity * Period / (4 * Math.PI)), 1e-12);
        }
    }

    // Fenton and McKee (1990): L = L0 tanh((2 pi h/L0)^(3/4))^(2/3), published accuracy about 1.7 % (from memory).
    // Against the exact root its largest error is 1.63 % (measured with brentq near k0 h = 0.34), so the solver must
    // stay within 1.7 % of it everywhere, and must differ from it by more than 1 % somewhere (it is not the approximation).
    [Fact]
    public void SolverStaysWithinFentonMcKeeAccuracyWithoutBeingTheApproximation()
    {
        double largest = 0;
        foreach (double y in LogSpace(1e-4, 30, 4000))
        {
            double exact = DispersionRelation.SolveRelativeDepth(y);
            double error = Math.Abs(DispersionApproximation.FentonMcKeeRelativeDepth(y) / exact - 1);
            largest = Math.Max(largest, error);
        }
        Assert.InRange(largest, 0.01, 0.017);

        double depth = 12.0;
        double approximate = DispersionApproximation.FentonMcKeeWavelength(Period, depth);
        AssertRelative(approximate, DispersionRelation.Wavelength(Period, depth), 0.017);
    }

    // Hunt (1979) Pade approximation, coefficients from memory; its largest error against brentq roots is 0.19 %,
    // so the tolerance is 0.2 %.
    [Fact]
    public void SolverStaysWithinHuntPadeAccuracy()
    {
        foreach (double y in LogSpace(1e-4, 30, 4000))
            AssertRelative(DispersionApproximation.HuntRelativeDepth(y), DispersionRelation.SolveRelativeDepth(y), 0.002);
    }

    // Deep-water limit of linear theory (tests/data/README.md): L0 = g T^2 / (2 pi) = 1.5613 T^2, n = 1/2, cg = g T / (4 pi).
    [Theory]
    [InlineData(double.NaN)]
    [InlineData(double.PositiveInfinity)]
    [InlineData(1e6)]
    public void DeepWaterGivesDeepWaterWavelengthAndHalfGroupRatio(double depth)
    {
        LinearWave wave = DispersionRelation.Solve(Period, depth);
        Assert.Equal(1.5613 * Period * Period, wave.Wavelength, 0.0001 * Period * Period); // 1.5613 is rounded to 4 decimals
        AssertRelative(PhysicalConstants.Gravity * Period * Period / (2 * Math.PI), wave.Wavelength, 1e-14);
        Assert.Equal(0.5, wave.GroupToPhaseSpeedRatio, 1e-14);
        AssertRelative(PhysicalConstants.Gravity * Period / (4 * Math.PI), wave.GroupVelocity, 1e-14);
    }

    // Shallow-water limit of linear theory (common practice): c = cg = sqrt(g h) as k h -> 0. Expanding tanh for
    // small y = k0 h gives c = sqrt(g h) (1 - y/6) and cg = sqrt(g h) (1 - y/2) with errors of order y^2, so those
    // are checked to 10 y^2.
    [Theory]
    [InlineData(1e-4, 20.0)]
    [InlineData(0.01, 30.0)]
    [InlineData(0.5, 60.0)]
    public void VeryShallowWaterGivesSquareRootOfGhForPhaseAndGroupSpeed(double depth, double period)
    {
        LinearWave wave = DispersionRelation.Solve(period, depth);
        double omega = 2 * Math.PI / period;
        double y = omega * omega * depth / PhysicalConstants.Gravity;
        double shallow = Math.Sqrt(PhysicalConstants.Gravity * depth);
        AssertRelative(shallow * (1 - y / 6), wave.PhaseSpeed, 10 * y * y + 1e-14);
        AssertRelative(shallow * (1 - y / 2), wave.GroupVelocity, 10 * y * y + 1e-14);
        // The root itself satisfies the relation to machine precision even this shallow.
        AssertRelative(omega * omega, PhysicalConstants.Gravity * wave.WaveNumber * Math.Tanh(wave.RelativeDepth), 1e-14);
    }

    [Fact]
    public void RootSatisfiesTheRelationAtEveryDepthAndPeriod()
    {
        foreach (double depth in LogSpace(0.01, 10000, 60))
            foreach (double period in LogSpace(0.3, 40, 60))
            {
                double k = DispersionRelation.WaveNumber(period, depth);
                double omega = 2 * Math.PI / period;
                AssertRelative(omega * omega, PhysicalConstants.Gravity * k * Math.Tanh(k * depth), 1e-14);
            }
    }

    [Theory]
    [InlineData(-1.0)]
    [InlineData(0.0)]
    [InlineData(double.NegativeInfinity)]
    public void DepthThatIsNotPositiveThrows(double depth)
    {
        var error = Assert.Throws<ArgumentOutOfRangeException>(() => DispersionRelation.Solve(Period, depth));
        Assert.Equal("depthMetres", error.ParamName);
    }

    [Theory]
    [InlineData(0.0)]
    [InlineData(-3.0)]
    [InlineData(double.PositiveInfinity)]
    public void PeriodThatIsNotPositiveAndFiniteThrows(double period)
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => DispersionRelation.Solve(period, 10));
    }

    [Fact]
    public void MissingPeriodGivesNaN()
    {
        LinearWave wave = DispersionRelation.Solve(double.NaN, 10);
        Assert.True(double.IsNaN(wave.WaveNumber));
        Assert.True(double.IsNaN(wave.GroupVelocity));
    }

    internal static IEnumerable<double> LogSpace(double from, double to, int count)
    {
        double a = Math.Log(from), b = Math.Log(to);
        for (int i = 0; i < count; i++) yield return Math.Exp(a + (b - a) * i / (count - 1));
    }

    internal static void AssertRelative(double expected, double actual, double tolerance)
    {
        double error = Math.Abs(actual / expected - 1);
        Assert.True(error <= tolerance, $"expected {expected:R}, got {actual:R}: relative error {error:E3} above {tolerance:E1}");
    }
}
