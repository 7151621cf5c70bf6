namespace Atlas.Assessment.Extremes;

/// <summary>A return level with its confidence interval.</summary>
/// <param name="ReturnPeriodYears">T, years.</param>
/// <param name="Level">The level exceeded on average once every T years; NaN where undefined (see <paramref name="Note"/>).</param>
/// <param name="Lower">Lower confidence bound (profile likelihood); NaN where undefined or where the profile could not be maximised (see <paramref name="Note"/>).</param>
/// <param name="Upper">Upper confidence bound (profile likelihood); +∞ when the profile never falls to the
/// critical value (the data cannot bound the level from above); NaN where undefined.</param>
/// <param name="ConfidenceLevel">Coverage of the interval, e.g. 0.95.</param>
/// <param name="IsLongExtrapolation">True when T exceeds <see cref="ExtremeCaution.LongExtrapolationRatio"/>
/// times the record length: treat the level with strong caution.</param>
/// <param name="Note">Why a value is undefined or open, or null.</param>
public sealed record ReturnLevel(
    double ReturnPeriodYears,
    double Level,
    double Lower,
    double Upper,
    double ConfidenceLevel,
    bool IsLongExtrapolation,
    string? Note);
