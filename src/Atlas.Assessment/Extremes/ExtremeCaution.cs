using System.Globalization;

namespace Atlas.Assessment.Extremes;

/// <summary>A caution attached to an extreme-value result. Every result carries at least the general one.</summary>
/// <param name="Kind">What the caution is about.</param>
/// <param name="Text">Plain-language text for a report.</param>
public sealed record ExtremeCaution(ExtremeCautionKind Kind, string Text)
{
    /// <summary>
    /// Return periods longer than this many times the record length are marked as long
    /// extrapolations. Common practice (no published source): beyond about 3-4 record lengths an
    /// estimate reflects the assumed tail shape more than the data.
    /// </summary>
    public const double LongExtrapolationRatio = 4.0;

    /// <summary>Fewer annual maxima than this draws a small-sample caution (common practice).</summary>
    public const int SmallAnnualMaximaSample = 20;

    /// <summary>Fewer storm peaks than this draws a small-sample caution (common practice).</summary>
    public const int SmallPeakSample = 30;

    /// <summary>True when <paramref name="returnPeriodYears"/> exceeds <see cref="LongExtrapolationRatio"/> times the record.</summary>
    public static bool IsLongExtrapolation(double returnPeriodYears, double recordYears) =>
        returnPeriodYears > LongExtrapolationRatio * recordYears;

    /// <summary>
    /// The cautions for a set of return levels: always the general caution, then a strong caution
    /// for long extrapolations, a small-sample caution, and notes on undefined or open levels.
    /// </summary>
    /// <param name="method">Short description of the method, e.g. "GEV fit to annual maxima".</param>
    /// <param name="recordYears">Length of the record the fit used, years.</param>
    /// <param name="sampleSize">Number of maxima or peaks fitted.</param>
    /// <param name="smallSampleLimit">Sample size below which the small-sample caution applies.</param>
    /// <param name="levels">The return levels reported.</param>
    public static IReadOnlyList<ExtremeCaution> Assess(
        string method, double recordYears, int sampleSize, int smallSampleLimit, IEnumerable<ReturnLevel> levels)
    {
        var invariant = CultureInfo.InvariantCulture;
        var levelList = levels.ToList();
        var cautions = new List<ExtremeCaution>
        {
            new(ExtremeCautionKind.General, string.Format(invariant,
                "Extreme values here come from a {0} over a {1:0.#}-year record. They are extrapolations from a fitted " +
                "distribution: they carry large statistical uncertainty (see the confidence intervals), depend on the choice " +
                "of distribution, threshold and declustering, and inherit the hindcast's errors in storm peaks. They are a " +
                "resource-assessment estimate, not a design basis; local codes and licensed professional practice govern design values.",
                method, recordYears)),
        };

        var longPeriods = levelList.Where(l => IsLongExtrapolation(l.ReturnPeriodYears, recordYears)).Select(l => l.ReturnPeriodYears).ToList();
        if (longPeriods.Count > 0)
            cautions.Add(new(ExtremeCautionKind.LongExtrapolation, string.Format(invariant,
                "STRONG CAUTION: the {0}-year level(s) extrapolate to {1:0.#} times the {2:0.#}-year record or more. Beyond about " +
                "{3:0} record lengths (common practice) the estimate rests on the assumed tail shape rather than on the data; do not " +
                "rely on it without a longer record or a regional analysis.",
                string.Join(", ", longPeriods.Select(t => t.ToString("0.#", invariant))), longPeriods.Min() / recordYears,
                recordYears, LongExtrapolationRatio)));

        if (sampleSize < smallSampleLimit)
            cautions.Add(new(ExtremeCautionKind.SmallSample, string.Format(invariant,
                "Only {0} values were fitted (fewer than {1}, common practice): the shape parameter is poorly determined and the " +
                "intervals are wide; prefer the two-parameter fit or a longer record.", sampleSize, smallSampleLimit)));

        foreach (var level in levelList.Where(l => double.IsNaN(l.Level) && l.Note is not null))
            cautions.Add(new(ExtremeCautionKind.UndefinedLevel,
                string.Format(invariant, "{0}-year level: {1}", level.ReturnPeriodYears, level.Note)));

        var open = levelList.Where(l => double.IsPositiveInfinity(l.Upper)).Select(l => l.ReturnPeriodYears).ToList();
        if (open.Count > 0)
            cautions.Add(new(ExtremeCautionKind.OpenInterval, string.Format(invariant,
                "The upper confidence bound of the {0}-year level(s) is unbounded: the record cannot rule out much larger values.",
                string.Join(", ", open.Select(t => t.ToString("0.#", invariant))))));
        return cautions;
    }
}
