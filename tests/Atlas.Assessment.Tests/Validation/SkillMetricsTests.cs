using System.Text.Json;
using Atlas.Assessment.Validation;
using Atlas.Statistics;

namespace Atlas.Assessment.Tests.Validation;

/// <summary>The same pairs scored once by NumPy/SciPy (Debian's /usr/bin/python3) for the whole class.</summary>
public sealed class SkillReference
{
    public double[] Observed { get; } = SeededSamples.WaveHeights(11, 400);
    public double[] Modelled { get; }
    public double[] ObservedDirections { get; } = SeededSamples.Uniform(12, 300, 0, 360);
    public double[] ModelledDirections { get; }
    public JsonElement Result { get; }

    public SkillReference()
    {
        var noise = SeededSamples.Normal(13, Observed.Length, 0, 0.25);
        Modelled = [.. Observed.Select((o, i) => 0.08 + 0.95 * o + noise[i])];
        var turn = SeededSamples.Normal(14, ObservedDirections.Length, 6, 20);
        ModelledDirections = [.. ObservedDirections.Select((o, i) => CircularStatistics.Normalise(o + turn[i]))];
        Result = ReferencePython.Run("""
            import json, sys
            import numpy as np
            from scipy import stats
            d = json.load(sys.stdin)
            o = np.array(d["o"]); m = np.array(d["m"])
            diff = m - o
            slope, intercept = np.polyfit(o, m, 1)
            do = np.array(d["do"]); dm = np.array(d["dm"])
            dd = (dm - do + 180.0) % 360.0 - 180.0
            print(json.dumps({
                "mean_o": float(np.mean(o)), "mean_m": float(np.mean(m)),
                "bias": float(np.mean(diff)),
                "rmse": float(np.sqrt(np.mean(diff ** 2))),
                "si": float(np.sqrt(np.mean(diff ** 2)) / np.mean(o)),
                "si_bc": float(np.std(diff) / np.mean(o)),
                "r": float(stats.pearsonr(o, m)[0]),
                "sym_slope": float(np.sqrt(np.sum(m ** 2) / np.sum(o ** 2))),
                "slope": float(slope), "intercept": float(intercept),
                "q_o": np.percentile(o, np.arange(1, 100), method="linear").tolist(),
                "q_m": np.percentile(m, np.arange(1, 100), method="linear").tolist(),
                "circ_bias": float(stats.circmean(dd, high=180.0, low=-180.0)),
                "circ_mean_o": float(stats.circmean(do, high=360.0, low=0.0)),
                "circ_rmse": float(np.sqrt(np.mean(dd ** 2))),
                "circ_mad": float(np.mean(np.abs(dd))),
            }))
            """, new { o = Observed, m = Modelled, @do = ObservedDirections, dm = ModelledDirections });
    }
}

public class SkillMetricsTests(SkillReference reference) : IClassFixture<SkillReference>
{
    // Tolerance 1e-12 relative for sums and means (same formulas, different summation order).
    private static void Close(double expected, double actual, double relative = 1e-12) =>
        Assert.True(Math.Abs(expected - actual) <= relative * Math.Max(1, Math.Abs(expected)), $"expected {expected}, got {actual}");

    [Fact]
    public void ScalarScoresAgreeWithNumpyAndScipy()
    {
        var scores = SkillMetrics.Compute(reference.Observed, reference.Modelled);
        var r = reference.Result;

        Assert.Equal(reference.Observed.Length, scores.Count);
        Close(r.Double("mean_o"), scores.MeanObserved);         // numpy.mean
        Close(r.Double("mean_m"), scores.MeanModelled);         // numpy.mean
        Close(r.Double("bias"), scores.Bias);                   // numpy.mean(m - o)
        Close(r.Double("rmse"), scores.Rmse);                   // numpy.sqrt(numpy.mean((m - o)**2))
        Close(r.Double("si"), scores.ScatterIndex);             // RMSE / numpy.mean(o)
        Close(r.Double("si_bc"), scores.BiasCorrectedScatterIndex); // numpy.std(m - o) (ddof 0) / mean(o)
        Close(r.Double("r"), scores.PearsonR, 1e-10);           // scipy.stats.pearsonr
        Close(r.Double("sym_slope"), scores.SymmetricSlope);    // sqrt(sum m^2 / sum o^2)
        Close(r.Double("slope"), scores.RegressionSlope, 1e-10);     // numpy.polyfit(o, m, 1)
        Close(r.Double("intercept"), scores.RegressionIntercept, 1e-10);
    }

    [Fact]
    public void QuantilePairsAgreeWithNumpyPercentileLinear()
    {
        var pairs = QuantileComparison.Compute(reference.Observed, reference.Modelled);
        double[] expectedObserved = reference.Result.Doubles("q_o"), expectedModelled = reference.Result.Doubles("q_m");

        Assert.Equal(99, pairs.Count);
        for (int i = 0; i < 99; i++)
        {
            Assert.Equal((i + 1) / 100.0, pairs[i].Probability, 1e-15);
            Close(expectedObserved[i], pairs[i].ObservedQuantile); // numpy.percentile(method="linear")
            Close(expectedModelled[i], pairs[i].ModelledQuantile);
        }
    }

    [Fact]
    public void DirectionalScoresAgreeWithScipyCircmean()
    {
        var scores = SkillMetrics.ComputeDirectional(reference.ObservedDirections, reference.ModelledDirections);
        var r = reference.Result;

        Close(r.Double("circ_bias"), scores.CircularBiasDegrees, 1e-10);               // scipy.stats.circmean of wrapped differences
        Close(r.Double("circ_mean_o"), scores.CircularMeanObservedDegrees, 1e-10);     // scipy.stats.circmean(high=360)
        Close(r.Double("circ_rmse"), scores.CircularRmseDegrees, 1e-10);               // numpy on ((m - o + 180) % 360 - 180)
        Close(r.Double("circ_mad"), scores.MeanAbsoluteDifferenceDegrees, 1e-10);
    }

    [Fact]
    public void SyntheticRecordOfModelPlusOffsetAndNoiseRecoversBiasAndScatterIndex()
    {
        // observed = model + 0.3 m + N(0, 0.2 m): expected bias = -0.3 m, RMSE^2 = 0.3^2 + 0.2^2,
        // bias-corrected SI = 0.2 / mean(observed). Tolerance: four standard errors of each estimate
        // (sd/sqrt(N) for the bias; sd * sqrt(1/(2N)) for the noise sd), N = 20000.
        const int n = 20_000;
        const double offset = 0.3, sd = 0.2;
        var model = SeededSamples.WaveHeights(21, n);
        var noise = SeededSamples.Normal(22, n, 0, sd);
        var observed = model.Select((m, i) => m + offset + noise[i]).ToArray();

        var scores = SkillMetrics.Compute(observed, model);

        Assert.Equal(-offset, scores.Bias, 4 * sd / Math.Sqrt(n));
        double meanObserved = observed.Average();
        double expectedRmse = Math.Sqrt(offset * offset + sd * sd);
        double noiseSdError = 4 * sd / Math.Sqrt(2.0 * n);
        Assert.Equal(expectedRmse / meanObserved, scores.ScatterIndex, (noiseSdError + 4 * sd / Math.Sqrt(n)) / meanObserved);
        Assert.Equal(sd / meanObserved, scores.BiasCorrectedScatterIndex, noiseSdError / meanObserved);
    }

    [Fact]
    public void EmptyPairsGiveNaNScoresAndZeroCount()
    {
        var scores = SkillMetrics.Compute([double.NaN], [1.0]);

        Assert.Equal(0, scores.Count);
        Assert.True(double.IsNaN(scores.Bias) && double.IsNaN(scores.Rmse) && double.IsNaN(scores.PearsonR));
        Assert.Equal(0, SkillMetrics.ComputeDirectional([], []).Count);
    }

    [Fact]
    public void PairsWithAMissingValueAreSkipped()
    {
        var scores = SkillMetrics.Compute([1.0, 2.0, double.NaN, 4.0], [1.5, 2.5, 3.0, double.NaN]);

        Assert.Equal(2, scores.Count);
        Assert.Equal(0.5, scores.Bias, 1e-15);
    }

    [Fact]
    public void DirectionBiasUsesTheSmallestSignedAngle()
    {
        // Hand-computed: 355 -> 5 is +10 degrees, 10 -> 0 is -10 degrees, 180 -> 190 is +10.
        var scores = SkillMetrics.ComputeDirectional([355, 10, 180], [5, 0, 190]);

        Assert.Equal(Math.Sqrt(100.0), scores.CircularRmseDegrees, 1e-12);
        Assert.Equal(10.0, scores.MeanAbsoluteDifferenceDegrees, 1e-12);
        Assert.True(scores.CircularBiasDegrees > 3 && scores.CircularBiasDegrees < 4); // atan2(mean sin, mean cos) of +10, -10, +10
    }
}
