using Atlas.WavePhysics;

namespace Atlas.Statistics;

/// <summary>
/// The method notes of the statistics, in words for the people who read them: recorded with every statistics pass,
/// shown in provenance and the API documentation. One text per rule, so every place says the same thing.
/// </summary>
public static class MethodNotes
{
    /// <summary>
    /// The version of the statistics method, raised whenever a change alters stored values: 1 the first atlas, 2
    /// calendar-true coverage, month-balanced seasons and annual period, the period directionality coefficient. A
    /// pass over a dataset whose statistics carry another version recomputes every cell, so no stored value of an
    /// older method is served beside new ones.
    /// </summary>
    public const int Version = 2;

    /// <summary>How coverage is counted and flagged.</summary>
    public static string Coverage(double lowCoverageThreshold) =>
        "coverage is counted against the calendar: a period expects the calendar hours of its months within the record's years " +
        "divided by the nominal time step (the most frequent interval between steps), so the months before the record starts " +
        "and after it ends count as missing; valid steps over expected steps below " +
        lowCoverageThreshold.ToString("P0", System.Globalization.CultureInfo.InvariantCulture) + " are flagged low_coverage";

    /// <summary>How the climatological seasons and the annual period are kept free of the bias of partial years.</summary>
    public const string Climatology =
        "month-balanced: in a season and in the annual period each calendar month weighs by its share of the calendar (its expected " +
        "steps), whatever share of the record's steps it holds, so a record that starts or ends mid-year does not over-weight the " +
        "months it holds more often; means are the weighted means of the values, percentiles and exceedance fractions are weighted " +
        "the same way, in the layers and in the point answers alike; months and single years are not weighted; with whole years the " +
        "weights are equal and the statistics are the plain ones";

    /// <summary>The weighted quantile definition of the month-balanced percentiles.</summary>
    public const string WeightedPercentiles =
        "the k-th sorted value (from 0) sits at the weighted rank (n - 1) W_k / (W - w_last), W_k the weight of the values below it, " +
        "W the total weight; the chosen definition's index (for the default, linear interpolation, (n - 1) p) is read on these ranks, " +
        "so equal weights give the unweighted definition exactly; layer percentiles read the weighted fixed-bin histograms " +
        "(within one bin width)";

    /// <summary>What a season gathers, climatologically and in one year, and how a single winter is labelled.</summary>
    public const string Seasons =
        "DJF, MAM, JJA, SON gather their calendar months (UTC) across all years of the record; a season of one year is contiguous: " +
        "the winter (DJF) of year Y is December of Y-1 with January and February of Y, labelled Y and by the interval of its months " +
        "(e.g. 2010-12/2011-02 for the winter of 2011); a winter whose December lies before the record starts, or whose January " +
        "and February lie after it ends, is flagged low_coverage";

    /// <summary>How the year-to-year variability is measured.</summary>
    public const string InterAnnual =
        "coefficients of variation (sample standard deviation over mean) of the yearly and per-season means use the years above the " +
        "coverage threshold only; the years left out are listed";

    /// <summary>How the directionality coefficient is computed from gridded fields.</summary>
    public static readonly string Directionality =
        "directionality coefficient of a period (IEC TS 62600-101): the directionally resolved power J_theta averaged over the period, " +
        "its largest value over theta divided by the period's mean omnidirectional power, with the direction of that largest value " +
        "(waves coming from); from gridded fields each step's directional distribution is modelled, not measured: a cosine-2s " +
        "distribution about the mean direction with s = 2 / sigma^2 - 1, sigma the circular directional spread " +
        "sqrt(2 (1 - m1)) in radians; the same at every frequency; summed through its circular harmonics to order " +
        DirectionalHarmonics.HighestOrder + "; a frequency-direction spectrum gives the exact value";

    /// <summary>The spectrum assumed to derive Te from Tp, in words.</summary>
    public static string AssumedSpectrum(SpectrumShape shape) =>
        $"{SpectrumShapeName(shape)}, Te = {PeriodConversion.EnergyToPeakPeriodRatio(shape).ToString("0.###", System.Globalization.CultureInfo.InvariantCulture)} Tp";

    private static string SpectrumShapeName(SpectrumShape shape) => shape switch
    {
        SpectrumShape.JonswapGamma33 => "JONSWAP spectrum with peak enhancement 3.3",
        SpectrumShape.PiersonMoskowitz => "Pierson-Moskowitz spectrum",
        _ => shape.ToString(),
    };
}
