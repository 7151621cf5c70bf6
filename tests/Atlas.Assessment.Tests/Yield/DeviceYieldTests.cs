using System.Text.Json;
using Atlas.Assessment.Yield;

namespace Atlas.Assessment.Tests.Yield;

/// <summary>scipy.interpolate.RegularGridInterpolator (SciPy 1.10, Debian) on the test matrix, run once for the class.</summary>
public sealed class InterpolationReference
{
    public PowerMatrix Matrix { get; }
    public double[] Hs { get; } = SeededSamples.Uniform(51, 40, 1.0, 3.0);
    public double[] Te { get; } = SeededSamples.Uniform(52, 40, 6.0, 12.0);
    public JsonElement Result { get; }

    public InterpolationReference()
    {
        using var reader = TestData.Open("power_matrix_te.csv");
        Matrix = PowerMatrixCsv.Parse(reader, "power_matrix_te.csv");
        var power = Enumerable.Range(0, 3).Select(i => Enumerable.Range(0, 4).Select(j => Matrix.PowerAtBinKw(i, j)).ToArray()).ToArray();
        Result = ReferencePython.Run("""
            import json, sys
            import numpy as np
            from scipy.interpolate import RegularGridInterpolator
            d = json.load(sys.stdin)
            grid = (np.array(d["hs_bins"]), np.array(d["te_bins"]))
            points = np.column_stack([d["hs"], d["te"]])
            linear = RegularGridInterpolator(grid, np.array(d["p"]), method="linear")(points)
            nearest = RegularGridInterpolator(grid, np.array(d["p"]), method="nearest")(points)
            print(json.dumps({"linear": linear.tolist(), "nearest": nearest.tolist()}))
            """, new { hs_bins = Matrix.HsCentresMetres, te_bins = Matrix.PeriodCentresSeconds, p = power, hs = Hs, te = Te });
    }
}

public class DeviceYieldTests(InterpolationReference reference) : IClassFixture<InterpolationReference>
{
    private const long Hour = 3600;
    private static readonly long January2021 = UnixSeconds.Of(new DateTime(2021, 1, 1, 0, 0, 0, DateTimeKind.Utc));

    private static RegularSeries Constant(long start, int steps, double value) => new(start, Hour, Enumerable.Repeat(value, steps).ToArray());

    [Fact]
    public void BilinearPowerMatchesScipyRegularGridInterpolatorInsideTheCentres()
    {
        var power = DeviceYield.PowerPerStep(reference.Matrix, reference.Hs, reference.Te, PowerMatrixInterpolation.Bilinear);
        var expected = reference.Result.Doubles("linear");

        // Reference: RegularGridInterpolator(method="linear"); tolerance 1e-10 kW (same bilinear formula).
        for (int i = 0; i < power.Length; i++)
            Assert.Equal(expected[i], power[i], 1e-10);
    }

    [Fact]
    public void NearestBinPowerMatchesScipyNearest()
    {
        var power = DeviceYield.PowerPerStep(reference.Matrix, reference.Hs, reference.Te, PowerMatrixInterpolation.NearestBin);

        // Reference: RegularGridInterpolator(method="nearest"); random points, so no point sits on a bin edge. Exact.
        Assert.Equal(reference.Result.Doubles("nearest"), power);
    }

    [Fact]
    public void OuterHalfBinsHoldTheEdgeValueAndBeyondTheEdgeIsZero()
    {
        var m = reference.Matrix; // Hs centres 1..3 m (edges 0.5, 3.5), Te centres 6..12 s (edges 5, 13)

        Assert.Equal(15.0, m.PowerKw(0.6, 7, PowerMatrixInterpolation.Bilinear), 1e-12);   // held at Hs 1 m: (10 + 20) / 2
        Assert.Equal(180.0, m.PowerKw(3.4, 12.9, PowerMatrixInterpolation.Bilinear), 1e-12);
        Assert.Equal(0.0, m.PowerKw(3.6, 10, PowerMatrixInterpolation.Bilinear));
        Assert.Equal(0.0, m.PowerKw(2.0, 4.9, PowerMatrixInterpolation.NearestBin));
        Assert.Equal(80.0, m.PowerKw(2.0, 7.0, PowerMatrixInterpolation.NearestBin)); // on the 6|8 s edge: the upper bin
        Assert.True(double.IsNaN(m.PowerKw(double.NaN, 8, PowerMatrixInterpolation.Bilinear)));
    }

    /// <summary>
    /// Hourly steps on bin centres, as many at each (Hs, Te) as <paramref name="counts"/> says: a joint occurrence
    /// table written out as the series the one production path takes.
    /// </summary>
    private static (RegularSeries Hs, RegularSeries Te) StepsOnBinCentres(double[] hsCentres, double[] teCentres, int[,] counts)
    {
        var hs = new List<double>();
        var te = new List<double>();
        for (int i = 0; i < hsCentres.Length; i++)
            for (int j = 0; j < teCentres.Length; j++)
                for (int n = 0; n < counts[i, j]; n++)
                {
                    hs.Add(hsCentres[i]);
                    te.Add(teCentres[j]);
                }
        return (new RegularSeries(January2021, Hour, [.. hs]), new RegularSeries(January2021, Hour, [.. te]));
    }

    [Fact]
    public void ProductionOfStepsCountedInAJointTableEqualsTheHandComputedSum()
    {
        int[,] counts =
        {
            { 5, 10, 5, 0 },
            { 2, 8, 6, 2 },
            { 0, 1, 1, 0 },
            { 0, 0, 2, 0 }, // Hs 4 m: beyond the matrix's 3.5 m edge
        };
        var (hs, te) = StepsOnBinCentres([1.0, 2.0, 3.0, 4.0], [6.0, 8.0, 10.0, 12.0], counts);

        var yield = DeviceYield.FromSeries(reference.Matrix, hs, te, WavePeriodKind.EnergyPeriod);

        // By hand: 5x10 + 10x20 + 5x30 + 2x40 + 8x80 + 6x120 + 2x80 + 1x180 + 1x270 = 2450 kW over 42 counts.
        double meanPower = 2450.0 / 42.0;
        Assert.Equal(meanPower, yield.MeanPowerKw, 1e-12);
        Assert.Equal(meanPower * 8766 / 1000, yield.AnnualEnergyMwh, 1e-9);
        Assert.Equal(meanPower / 270.0, yield.CapacityFactor, 1e-12);
        Assert.Equal(2.0 / 42.0, yield.OutsideMatrixFraction, 1e-15);
    }

    [Fact]
    public void ConstantMatrixGivesCapacityFactorOfConstantOverRated()
    {
        var constant = new PowerMatrix("constant", WavePeriodKind.EnergyPeriod, [0.5, 5.0], [4.0, 16.0], new double[,] { { 200, 200 }, { 200, 200 } }, ratedPowerKw: 500);
        var hs = new RegularSeries(January2021, Hour, SeededSamples.Uniform(61, 2000, 0.5, 5.0));
        var te = new RegularSeries(January2021, Hour, SeededSamples.Uniform(62, 2000, 4.0, 16.0));

        var yield = DeviceYield.FromSeries(constant, hs, te, WavePeriodKind.EnergyPeriod);

        Assert.Equal(200.0 / 500.0, yield.CapacityFactor, 1e-12);
        Assert.Equal(200.0, yield.MeanPowerKw, 1e-10);
        Assert.Equal(0, yield.OutsideMatrixSteps);
        var (tableHs, tableTe) = StepsOnBinCentres([1.0, 2.0], [6.0, 9.0], new[,] { { 3, 2 }, { 1, 4 } });
        Assert.Equal(0.4, DeviceYield.FromSeries(constant, tableHs, tableTe, WavePeriodKind.EnergyPeriod).CapacityFactor, 1e-12);
    }

    [Fact]
    public void MeanPowerIsNotPowerOfMeans()
    {
        // Alternating (1 m, 6 s) -> 10 kW and (3 m, 10 s) -> 270 kW: the mean power is 140 kW, while the power
        // of the mean sea state (2 m, 8 s) is 80 kW.
        var hs = new RegularSeries(January2021, Hour, [1, 3, 1, 3]);
        var te = new RegularSeries(January2021, Hour, [6, 10, 6, 10]);

        var yield = DeviceYield.FromSeries(reference.Matrix, hs, te, WavePeriodKind.EnergyPeriod);

        Assert.Equal(140.0, yield.MeanPowerKw, 1e-12);
        Assert.Equal(80.0, reference.Matrix.PowerKw(2, 8, PowerMatrixInterpolation.Bilinear), 1e-12);
    }

    [Fact]
    public void StepsOutsideTheMatrixProduceNothingAndAreCounted()
    {
        var hs = new RegularSeries(January2021, Hour, [2, 2, 5, 2, double.NaN]);
        var te = new RegularSeries(January2021, Hour, [8, 4, 8, 8, 8]);

        var yield = DeviceYield.FromSeries(reference.Matrix, hs, te, WavePeriodKind.EnergyPeriod);

        Assert.Equal(4, yield.ValidSteps);
        Assert.Equal(1, yield.MissingSteps);
        Assert.Equal(2, yield.OutsideMatrixSteps); // Te 4 s below the 5 s edge; Hs 5 m above the 3.5 m edge
        Assert.Equal(0.5, yield.OutsideMatrixFraction);
        Assert.Equal((80 + 0 + 0 + 80) / 4.0, yield.MeanPowerKw, 1e-12);
    }

    [Fact]
    public void MonthlyProductionUsesEachMonthsMeanLength()
    {
        int steps = 2 * 8760; // 2021 and 2022, hourly
        var yield = DeviceYield.FromSeries(reference.Matrix, Constant(January2021, steps, 2.0), Constant(January2021, steps, 10.0), WavePeriodKind.EnergyPeriod);

        // 120 kW throughout. January: 120 kW x 744 h; February: 120 kW x 28.25 days x 24 h (mean February).
        Assert.Equal(120 * 744 / 1000.0, yield.Months[0].MeanEnergyMwh, 1e-9);
        Assert.Equal(120 * 678 / 1000.0, yield.Months[1].MeanEnergyMwh, 1e-9);
        Assert.Equal(120 * 8766 / 1000.0, yield.AnnualEnergyMwh, 1e-9);
        Assert.Equal(yield.AnnualEnergyMwh, yield.Months.Sum(m => m.MeanEnergyMwh), 1e-9);
        Assert.Equal(0.0, yield.InterannualCoefficientOfVariation, 1e-12);
        Assert.Equal(2, yield.CompleteYears);
    }

    [Fact]
    public void InterannualVariationIsTheSampleCoefficientOfVariationOfCompleteYears()
    {
        // 2021: 1 m (30 kW), 2022: 2 m (120 kW), 2023: 3 m (270 kW), all at Te 10 s; 2024 has 10 days only.
        var hsValues = new List<double>();
        hsValues.AddRange(Enumerable.Repeat(1.0, 8760));
        hsValues.AddRange(Enumerable.Repeat(2.0, 8760));
        hsValues.AddRange(Enumerable.Repeat(3.0, 8760));
        hsValues.AddRange(Enumerable.Repeat(3.0, 240));
        var hs = new RegularSeries(January2021, Hour, hsValues.ToArray());
        var te = Constant(January2021, hsValues.Count, 10.0);

        var yield = DeviceYield.FromSeries(reference.Matrix, hs, te, WavePeriodKind.EnergyPeriod);

        double[] energies = [30 * 8.760, 120 * 8.760, 270 * 8.760]; // MWh, by hand
        double mean = energies.Average();
        double sampleSd = Math.Sqrt(energies.Sum(e => (e - mean) * (e - mean)) / 2);
        Assert.Equal(energies, yield.Years.Take(3).Select(y => Math.Round(y.EnergyMwh, 9)));
        Assert.False(yield.Years[3].IsComplete);
        Assert.Equal(240.0 / 8784.0, yield.Years[3].Coverage, 1e-12);
        Assert.Equal(3, yield.CompleteYears);
        Assert.Equal(sampleSd / mean, yield.InterannualCoefficientOfVariation, 1e-12);
    }

    [Fact]
    public void PeakPeriodSeriesIsRefusedByAnEnergyPeriodMatrix()
    {
        var series = Constant(January2021, 10, 2.0);

        var failure = Assert.Throws<ArgumentException>(() => DeviceYield.FromSeries(reference.Matrix, series, series, WavePeriodKind.PeakPeriod));
        Assert.Contains("convert the period first", failure.Message);
    }
}
