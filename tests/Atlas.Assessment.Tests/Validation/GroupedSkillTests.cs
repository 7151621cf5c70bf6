using Atlas.Assessment.Validation;
using Atlas.Statistics;

namespace Atlas.Assessment.Tests.Validation;

/// <summary>
/// Skill by season and by class of the observed Hs, scored on each subset by NumPy and SciPy (Debian's /usr/bin/python3):
/// the seasons by calendar month (numpy.datetime64), the classes by the observed value, bias, RMSE and scatter index with
/// numpy, Pearson r and the fitted line with scipy.stats.linregress. Invented pairs over two years, three-hourly.
/// </summary>
public class GroupedSkillTests
{
    private static void Close(double expected, double actual, double relative = 1e-10) =>
        Assert.True(Math.Abs(expected - actual) <= relative * Math.Max(1, Math.Abs(expected)), $"expected {expected}, got {actual}");

    [Fact]
    public void SkillBySeasonAndByHsClassAgreesWithNumpyAndScipyLinregressOnEachSubset()
    {
        const int n = 2 * 2920;
        var start = UnixSeconds.Of(new DateTime(2021, 1, 1, 0, 0, 0, DateTimeKind.Utc));
        var times = Enumerable.Range(0, n).Select(i => start + i * 3 * 3600L).ToArray();
        var observed = SeededSamples.WaveHeights(31, n);
        var noise = SeededSamples.Normal(32, n, 0, 0.3);
        var modelled = observed.Select((o, i) => 0.1 + 0.9 * o + noise[i]).ToArray();
        var bounds = new ValidationOptions().ObservedClassLowerBounds.ToArray();

        var report = HindcastValidation.Assess(MatchedSeries.FromPairs(times, observed, modelled, false));
        var reference = ReferencePython.Run("""
            import json, sys
            import numpy as np
            from scipy import stats
            d = json.load(sys.stdin)
            t = np.array(d["t"], dtype="int64"); o = np.array(d["o"]); m = np.array(d["m"]); b = d["b"]
            month = (t.astype("datetime64[s]").astype("datetime64[M]").astype(int) % 12) + 1
            def score(k):
                oo, mm = o[k], m[k]
                fit = stats.linregress(oo, mm)
                diff = mm - oo
                return {"n": int(k.sum()), "bias": float(diff.mean()), "rmse": float(np.sqrt(np.mean(diff ** 2))),
                        "si": float(np.sqrt(np.mean(diff ** 2)) / oo.mean()), "r": float(fit.rvalue),
                        "slope": float(fit.slope), "intercept": float(fit.intercept)}
            seasons = {"djf": [12, 1, 2], "mam": [3, 4, 5], "jja": [6, 7, 8], "son": [9, 10, 11]}
            out = {"season": {s: score(np.isin(month, ms)) for s, ms in seasons.items()}, "cls": []}
            for i, lo in enumerate(b):
                hi = b[i + 1] if i + 1 < len(b) else np.inf
                out["cls"].append(score((o >= lo) & (o < hi)))
            print(json.dumps(out))
            """, new { t = times, o = observed, m = modelled, b = bounds });

        foreach (var season in report.BySeason)
            Same(reference.GetProperty("season").GetProperty(season.Season.Name), season.Scores);
        var classes = reference.GetProperty("cls").EnumerateArray().ToArray();
        Assert.Equal(classes.Length, report.ByObservedClass.Count);
        for (var k = 0; k < classes.Length; k++)
        {
            Assert.Equal(bounds[k], report.ByObservedClass[k].LowerBound);
            Same(classes[k], report.ByObservedClass[k].Scores);
        }
    }

    private static void Same(System.Text.Json.JsonElement expected, SkillScores actual)
    {
        Assert.Equal(expected.GetProperty("n").GetInt32(), actual.Count);
        Close(expected.Double("bias"), actual.Bias);                        // numpy.mean(m - o)
        Close(expected.Double("rmse"), actual.Rmse);                        // numpy.sqrt(numpy.mean((m - o)**2))
        Close(expected.Double("si"), actual.ScatterIndex);                  // RMSE / numpy.mean(o)
        Close(expected.Double("r"), actual.PearsonR);                       // scipy.stats.linregress(o, m).rvalue
        Close(expected.Double("slope"), actual.RegressionSlope);            // scipy.stats.linregress(o, m).slope
        Close(expected.Double("intercept"), actual.RegressionIntercept);    // scipy.stats.linregress(o, m).intercept
    }
}
