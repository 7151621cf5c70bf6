using Atlas.Statistics;

namespace Atlas.Assessment.Validation;

/// <summary>Builds the validation reports of matched hindcast-station pairs.</summary>
public static class HindcastValidation
{
    /// <summary>The four seasons, DJF to SON, in the order the reports list them.</summary>
    private static readonly AtlasPeriod[] Seasons = [AtlasPeriod.Djf, AtlasPeriod.Mam, AtlasPeriod.Jja, AtlasPeriod.Son];

    /// <summary>Scores a scalar matched series overall, per season, per observed class, with quantiles.</summary>
    /// <exception cref="ArgumentException">The series holds directions, or the class bounds are not strictly ascending.</exception>
    public static ScalarValidationReport Assess(MatchedSeries pairs, ValidationOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(pairs);
        options ??= new ValidationOptions();
        if (pairs.IsCircular)
            throw new ArgumentException("The series holds directions; use AssessDirection.", nameof(pairs));
        var bounds = options.ObservedClassLowerBounds;
        for (int i = 1; i < bounds.Count; i++)
            if (!(bounds[i] > bounds[i - 1]))
                throw new ArgumentException($"Class lower bounds must strictly ascend; {bounds[i]} follows {bounds[i - 1]}.", nameof(options));

        var bySeason = Seasons
            .Select(season => new SeasonSkill(season, SkillMetrics.Compute(pairs.WhereSeason(season))))
            .ToArray();
        var byClass = bounds
            .Select((lower, i) =>
            {
                double upper = i + 1 < bounds.Count ? bounds[i + 1] : double.PositiveInfinity;
                return new ClassSkill(lower, upper, SkillMetrics.Compute(pairs.WhereObservedIn(lower, upper)));
            })
            .ToArray();
        return new ScalarValidationReport(
            pairs.Counts,
            SkillMetrics.Compute(pairs),
            bySeason,
            byClass,
            QuantileComparison.Compute(pairs.Observed, pairs.Modelled, options.QuantileProbabilities),
            pairs);
    }

    /// <summary>Scores a matched series of directions overall and per season, on the circle.</summary>
    /// <exception cref="ArgumentException">The series is not circular.</exception>
    public static DirectionalValidationReport AssessDirection(MatchedSeries pairs)
    {
        ArgumentNullException.ThrowIfNull(pairs);
        var bySeason = Seasons
            .Select(season => new SeasonDirectionalSkill(season, SkillMetrics.ComputeDirectional(pairs.WhereSeason(season))))
            .ToArray();
        return new DirectionalValidationReport(pairs.Counts, SkillMetrics.ComputeDirectional(pairs), bySeason, pairs);
    }
}
