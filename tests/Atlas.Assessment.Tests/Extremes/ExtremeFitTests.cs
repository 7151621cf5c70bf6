using System.Text.Json;
using Atlas.Assessment.Extremes;

namespace Atlas.Assessment.Tests.Extremes;

// Reference: SciPy 1.10 (scipy.stats.genextreme / gumbel_r / genpareto .fit, .ppf, .isf) on the same
// samples; see ExtremeFitReference. Both sides maximise the same likelihood with different optimisers,
// so parameters and levels agree to the optimisers' stopping precision: tolerance 1e-5 relative for
// location, scale and levels, 1e-5 absolute for the shape; the log-likelihood here must be at least
// SciPy's minus 1e-9. Intervals are checked against a profile likelihood built from scipy.stats logpdf,
// scipy.optimize.minimize (Nelder-Mead) and brentq, tolerance 1e-6 relative.
public class ExtremeFitTests(ExtremeFitReference reference) : IClassFixture<ExtremeFitReference>
{
    private static void Relative(double expected, double actual, double tolerance) =>
        Assert.True(Math.Abs(expected - actual) <= tolerance * Math.Abs(expected), $"expected {expected}, got {actual} (relative tolerance {tolerance})");

    private JsonElement Scipy(string name) => reference.Result.GetProperty(name);

    [Theory]
    [InlineData("gev_heavy")]
    [InlineData("gev_bounded")]
    public void GevParametersAndReturnLevelsMatchScipyGenextremeFit(string name)
    {
        var sample = name == "gev_heavy" ? reference.GevHeavy : reference.GevBounded;
        var fit = GevMaximumLikelihood.FitGev(sample);
        var scipy = Scipy(name);

        Relative(scipy.Double("loc"), fit.Distribution.Location, 1e-5);
        Relative(scipy.Double("scale"), fit.Distribution.Scale, 1e-5);
        Assert.Equal(scipy.Double("c"), fit.Distribution.ScipyShapeC, 1e-5); // SciPy's c = -ξ
        Assert.True(fit.LogLikelihood >= scipy.Double("ll") - 1e-9);
        var levels = scipy.Doubles("levels");
        for (int i = 0; i < ExtremeFitReference.Periods.Length; i++)
            Relative(levels[i], fit.ReturnLevel(ExtremeFitReference.Periods[i]).Level, 1e-5);
    }

    [Fact]
    public void HeavyAndBoundedSamplesGiveShapesOfOppositeSign()
    {
        // The seeded samples were drawn with ξ = +0.15 and ξ = -0.2 (Coles' sign).
        Assert.True(GevMaximumLikelihood.FitGev(reference.GevHeavy).Distribution.Shape > 0.05);
        Assert.True(GevMaximumLikelihood.FitGev(reference.GevBounded).Distribution.Shape < -0.05);
        Assert.True(Scipy("gev_heavy").Double("c") < 0); // SciPy's genextreme c is negative for a heavy tail
    }

    [Fact]
    public void GumbelParametersAndReturnLevelsMatchScipyGumbelRFit()
    {
        var fit = GevMaximumLikelihood.FitGumbel(reference.Gumbel);
        var scipy = Scipy("gumbel");

        Assert.True(fit.ShapeFixedAtZero);
        Relative(scipy.Double("loc"), fit.Distribution.Location, 1e-5);
        Relative(scipy.Double("scale"), fit.Distribution.Scale, 1e-5);
        var levels = scipy.Doubles("levels");
        for (int i = 0; i < ExtremeFitReference.Periods.Length; i++)
            Relative(levels[i], fit.ReturnLevel(ExtremeFitReference.Periods[i]).Level, 1e-5);
    }

    [Theory]
    [InlineData("excesses_heavy")]
    [InlineData("excesses_bounded")]
    public void GpdParametersAndReturnLevelsMatchScipyGenparetoFitOnExcesses(string name)
    {
        var excesses = name == "excesses_heavy" ? reference.ExcessesHeavy : reference.ExcessesBounded;
        // Threshold 0 makes the peaks the excesses themselves, as genpareto.fit(excesses, floc=0) sees them.
        var fit = GpdMaximumLikelihood.Fit(excesses, 0, ExtremeFitReference.Rate);
        var scipy = Scipy(name);

        Relative(scipy.Double("scale"), fit.Distribution.Scale, 1e-5);
        Assert.Equal(scipy.Double("c"), fit.Distribution.Shape, 1e-5); // genpareto's c has Coles' sign
        Assert.True(fit.LogLikelihood >= scipy.Double("ll") - 1e-9);
        var levels = scipy.Doubles("levels"); // genpareto.isf(1 / (rate T))
        for (int i = 0; i < ExtremeFitReference.Periods.Length; i++)
            Relative(levels[i], fit.ReturnLevel(ExtremeFitReference.Periods[i]).Level, 1e-5);
    }

    [Theory]
    [InlineData("gev_heavy")]
    [InlineData("gev_bounded")]
    [InlineData("gumbel")]
    [InlineData("excesses_heavy")]
    [InlineData("excesses_bounded")]
    public void ProfileLikelihoodIntervalMatchesAScipyProfileOfTheSameLikelihood(string name)
    {
        var level = name switch
        {
            "gev_heavy" => GevMaximumLikelihood.FitGev(reference.GevHeavy).ReturnLevel(ExtremeFitReference.ProfilePeriod),
            "gev_bounded" => GevMaximumLikelihood.FitGev(reference.GevBounded).ReturnLevel(ExtremeFitReference.ProfilePeriod),
            "gumbel" => GevMaximumLikelihood.FitGumbel(reference.Gumbel).ReturnLevel(ExtremeFitReference.ProfilePeriod),
            "excesses_heavy" => GpdMaximumLikelihood.Fit(reference.ExcessesHeavy, 0, ExtremeFitReference.Rate).ReturnLevel(ExtremeFitReference.ProfilePeriod),
            _ => GpdMaximumLikelihood.Fit(reference.ExcessesBounded, 0, ExtremeFitReference.Rate).ReturnLevel(ExtremeFitReference.ProfilePeriod),
        };
        var ci = Scipy(name).Doubles("ci");

        Assert.Equal(0.95, level.ConfidenceLevel);
        Relative(ci[0], level.Lower, 1e-6);
        Relative(ci[1], level.Upper, 1e-6);
        Assert.True(level.Lower < level.Level && level.Level < level.Upper);
    }

    [Fact]
    public void OneYearLevelFromAnnualMaximaIsUndefinedAndSaysWhy()
    {
        var level = GevMaximumLikelihood.FitGev(reference.GevHeavy).ReturnLevel(1);

        Assert.True(double.IsNaN(level.Level) && double.IsNaN(level.Lower) && double.IsNaN(level.Upper));
        Assert.Contains("peaks-over-threshold", level.Note);
    }

    [Fact]
    public void GpdLevelBelowOnePeakPerPeriodIsUndefinedAndSaysWhy()
    {
        // Rate 0.5 peaks a year: the 1-year level (λT = 0.5) lies below the threshold.
        var level = GpdMaximumLikelihood.Fit(reference.ExcessesHeavy, 0, 0.5).ReturnLevel(1);

        Assert.True(double.IsNaN(level.Level));
        Assert.Contains("Lower the threshold", level.Note);
    }

    [Fact]
    public void DiagnosticsPairEachSortedValueWithPlottingPositionAndFittedQuantile()
    {
        var fit = GevMaximumLikelihood.FitGev(reference.GevHeavy);
        var points = fit.ProbabilityPlot();
        int n = reference.GevHeavy.Length;

        Assert.Equal(n, points.Count);
        Assert.Equal(reference.GevHeavy.Order(), points.Select(p => p.Value));
        Assert.Equal(1.0 / (n + 1), points[0].EmpiricalProbability, 1e-15);
        Assert.All(points, p => Assert.Equal(fit.Distribution.Quantile(p.EmpiricalProbability), p.FittedQuantile, 1e-12));
        Assert.All(points, p => Assert.Equal(fit.Distribution.Cdf(p.Value), p.FittedProbability, 1e-12));
    }

    [Fact]
    public void TooFewOrConstantValuesAreRejected()
    {
        Assert.Throws<ArgumentException>(() => GevMaximumLikelihood.FitGev([1, 2, 3, 4]));
        Assert.Throws<ArgumentException>(() => GevMaximumLikelihood.FitGumbel([2, 2, 2, 2, 2, 2]));
        Assert.Throws<ArgumentException>(() => GpdMaximumLikelihood.Fit([1, 2, 3, 4, 5], 3, 1)); // peaks at or below the threshold
    }
}
