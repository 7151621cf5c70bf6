using Atlas.Statistics;

namespace Atlas.Assessment.Validation;

/// <summary>Scores of the pairs whose observation falls in one season.</summary>
public sealed record SeasonSkill(AtlasPeriod Season, SkillScores Scores);

/// <summary>Scores of the pairs whose observed value lies in [<paramref name="LowerBound"/>, <paramref name="UpperBound"/>).</summary>
/// <param name="LowerBound">Inclusive lower bound of the observed value.</param>
/// <param name="UpperBound">Exclusive upper bound; +infinity for the last class.</param>
/// <param name="Scores">The scores of that class.</param>
public sealed record ClassSkill(double LowerBound, double UpperBound, SkillScores Scores);

/// <summary>Directional scores of the pairs whose observation falls in one season.</summary>
public sealed record SeasonDirectionalSkill(AtlasPeriod Season, DirectionalSkillScores Scores);

/// <summary>Validation of a scalar variable (Hs, Tp, Te) against a station.</summary>
/// <param name="Counts">Matched and unmatched observations, with reasons.</param>
/// <param name="Overall">Scores over all pairs.</param>
/// <param name="BySeason">Scores per season, DJF to SON (a season without pairs has count 0 and NaN scores).</param>
/// <param name="ByObservedClass">Scores per class of the observed value.</param>
/// <param name="Quantiles">Quantile-quantile comparison.</param>
/// <param name="Pairs">The matched pairs, for a scatter plot.</param>
public sealed record ScalarValidationReport(
    MatchCounts Counts,
    SkillScores Overall,
    IReadOnlyList<SeasonSkill> BySeason,
    IReadOnlyList<ClassSkill> ByObservedClass,
    IReadOnlyList<QuantilePair> Quantiles,
    MatchedSeries Pairs);

/// <summary>Validation of directions against a station.</summary>
/// <param name="Counts">Matched and unmatched observations, with reasons.</param>
/// <param name="Overall">Circular scores over all pairs.</param>
/// <param name="BySeason">Circular scores per season, DJF to SON.</param>
/// <param name="Pairs">The matched pairs, for a scatter plot.</param>
public sealed record DirectionalValidationReport(
    MatchCounts Counts,
    DirectionalSkillScores Overall,
    IReadOnlyList<SeasonDirectionalSkill> BySeason,
    MatchedSeries Pairs);
