using static Atlas.WavePhysics.Tests.DispersionRelationTests;

namespace Atlas.WavePhysics.Tests;

public class WavePowerTests
{
    // IEC TS 62600-101 (from memory, tests/data/README.md): deep-water J = rho g^2 Hm0^2 Te / (64 pi) = 0.4906 Hm0^2 Te kW/m.
    // 0.4906 is rounded to four decimals, so the coefficient must lie within 0.00005 of it.
    [Fact]
    public void DeepWaterCoefficientIsPointFourNineZeroSix()
    {
        Assert.Equal(0.4906, WavePower.DeepWaterCoefficient, 0.00005);
    }

    // The deep-water value must come out of the finite-depth formula itself (computation rules, tests/data/README.md).
    [Theory]
    [InlineData(2.0, 8.0)]
    [InlineData(5.5, 12.3)]
    [InlineData(0.3, 3.0)]
    public void UnknownOrInfiniteDepthGivesDeepWaterPowerFromTheSameFormula(double hm0, double te)
    {
        double expected = 0.4906 * hm0 * hm0 * te;
        Assert.Equal(expected, WavePower.OmnidirectionalPower(hm0, te, double.NaN), 0.0001 * expected);
        Assert.Equal(expected, WavePower.OmnidirectionalPower(hm0, te, double.PositiveInfinity), 0.0001 * expected);
        AssertRelative(WavePower.DeepWaterPower(hm0, te), WavePower.OmnidirectionalPower(hm0, te, double.NaN), 1e-14);
        AssertRelative(WavePower.DeepWaterPower(hm0, te), WavePower.OmnidirectionalPower(hm0, te, 10_000), 1e-14);
    }

    // J / J_deep = cg / cg0 at the same period: the brentq column of tests/data/physics/dispersion_brentq.csv;
    // relative tolerance 1e-12.
    [Fact]
    public void FiniteDepthPowerScalesWithGroupVelocityOfBrentRoots()
    {
        const double hm0 = 2.5, te = 9.0;
        double l0 = DispersionRelation.DeepWaterWavelength(te);
        foreach (var row in ReferenceTable.Read("dispersion_brentq.csv"))
        {
            double j = WavePower.OmnidirectionalPower(hm0, te, row["h_over_L0"] * l0);
            AssertRelative(row["cg_over_cg0"] * WavePower.DeepWaterPower(hm0, te), j, 1e-12);
        }
    }

    // The fast table against the brentq column (external) and against the exact solver over the whole range of
    // depths and periods met in hindcasts and beyond (relative tolerance: the table's stated maximum error).
    [Fact]
    public void TabulatedGroupVelocityStaysWithinItsStatedErrorOfTheExactSolver()
    {
        const double te = 9.0;
        double l0 = DispersionRelation.DeepWaterWavelength(te);
        foreach (var row in ReferenceTable.Read("dispersion_brentq.csv"))
        {
            var table = new GroupVelocityTable(row["h_over_L0"] * l0);
            AssertRelative(row["cg_over_cg0"], table.DeepWaterRatio(te), GroupVelocityTable.MaxRelativeError);
        }

        double largest = 0;
        foreach (double depth in LogSpace(0.05, 6000, 300))
        {
            var table = new GroupVelocityTable(depth);
            foreach (double period in LogSpace(0.5, 35, 700))
            {
                double exact = DispersionRelation.GroupVelocity(period, depth);
                largest = Math.Max(largest, Math.Abs(table.GroupVelocity(period) / exact - 1));
            }
        }
        Assert.True(largest <= GroupVelocityTable.MaxRelativeError, $"largest relative error {largest:E3}");
    }

    [Fact]
    public void TabulatedPowerInDeepWaterIsTheDeepWaterFormula()
    {
        var table = new GroupVelocityTable(double.NaN);
        Assert.True(table.IsDeepWater);
        AssertRelative(WavePower.DeepWaterPower(3, 10), table.Power(3, 10), 1e-15);
    }

    [Fact]
    public void BatchPowerMarksStepsWithMissingOrInvalidInputAsNaN()
    {
        float[] hs = [2f, float.NaN, 2f, -1f, 3f];
        float[] te = [8f, 8f, float.NaN, 8f, 0f];
        var power = new float[5];
        WavePower.OmnidirectionalPower(hs, te, new GroupVelocityTable(30), power);
        Assert.Equal(WavePower.OmnidirectionalPower(2, 8, 30), power[0], 2e-6 * power[0]); // float storage
        Assert.All(power.Skip(1), p => Assert.True(float.IsNaN(p)));
    }

    [Fact]
    public void NegativeDepthForTheTableThrows()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => new GroupVelocityTable(-5));
    }
}
