using System.Text.Json;
using Atlas.Assessment.Extremes;

namespace Atlas.Assessment.Tests.Extremes;

/// <summary>
/// Seeded samples drawn from known distributions and their SciPy 1.10 fits, both stored under
/// tests/data/assessment: <c>extreme_fit_samples.json</c> holds the samples, <c>extreme_fits.json</c> what
/// <c>extreme_fits.py</c> (Debian's /usr/bin/python3) computed from them: genextreme.fit, gumbel_r.fit and
/// genpareto.fit(floc=0), each with a tight Nelder-Mead (scipy.optimize.fmin, xtol 1e-10, ftol 1e-12) so the
/// comparison is not limited by SciPy's default stopping rule, and the profile likelihood of the 50-year level
/// (scipy.optimize Nelder-Mead and brentq) for the confidence-interval checks. The fits are stored because they take
/// minutes on a busy machine; <see cref="ExtremeFitReferenceFilesTests"/> checks that the samples are still the
/// seeded draws and that the script still reproduces the stored fits.
/// </summary>
public sealed class ExtremeFitReference
{
    public static readonly double[] Periods = [2, 5, 10, 50, 100];
    public const double ProfilePeriod = 50;
    public const double Rate = 5.0; // peaks per year used for the GPD return levels

    public const string SamplesFile = "extreme_fit_samples.json", FitsFile = "extreme_fits.json", Script = "extreme_fits.py";

    public JsonElement Samples { get; } = TestData.ReadJson(SamplesFile);
    public JsonElement Result { get; } = TestData.ReadJson(FitsFile);

    public double[] GevHeavy => Samples.Doubles("gev_heavy");
    public double[] GevBounded => Samples.Doubles("gev_bounded");
    public double[] Gumbel => Samples.Doubles("gumbel");
    public double[] ExcessesHeavy => Samples.Doubles("excesses_heavy");
    public double[] ExcessesBounded => Samples.Doubles("excesses_bounded");

    /// <summary>The samples as the seeded draws make them (the stored file must hold exactly these).</summary>
    public static Dictionary<string, double[]> SeededDraws() => new()
    {
        ["gev_heavy"] = Draw(109, 60, u => new GevDistribution(4.0, 0.9, 0.15).Quantile(u)),
        ["gev_bounded"] = Draw(107, 60, u => new GevDistribution(6.0, 1.3, -0.2).Quantile(u)),
        ["gumbel"] = Draw(103, 40, u => new GevDistribution(5.0, 1.1, 0).Quantile(u)),
        ["excesses_heavy"] = Draw(104, 150, u => new GeneralizedParetoDistribution(0.8, 0.1).Quantile(u)),
        ["excesses_bounded"] = Draw(107, 150, u => new GeneralizedParetoDistribution(1.2, -0.2).Quantile(u)),
    };

    private static double[] Draw(int seed, int count, Func<double, double> quantile) =>
        [.. SeededSamples.Uniform(seed, count, 0, 1).Select(quantile)];
}
