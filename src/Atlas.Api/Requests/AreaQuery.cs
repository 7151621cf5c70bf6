using Microsoft.AspNetCore.Mvc;

namespace Atlas.Api.Requests;

/// <summary>The query of <c>POST /area</c>: the layer (j, mean, annual by default) and an optional threshold.</summary>
public sealed record AreaQuery(
    [property: FromQuery(Name = "parameter")] string? Parameter,
    [property: FromQuery(Name = "statistic")] string? Statistic,
    [property: FromQuery(Name = "period")] string? Period,
    [property: FromQuery(Name = "threshold")] string? Threshold)
{
    /// <summary>The layer and threshold, or null with every fault in <paramref name="errors"/>.</summary>
    public (WaveParameter Parameter, StatisticKind Statistic, AtlasPeriod Period, double? Threshold)? Read(QueryErrors errors)
    {
        var p = WaveParameter.J;
        var s = StatisticKind.Mean;
        var t = AtlasPeriod.Annual;
        if (Parameter is not null && !WaveParameterNames.TryParse(Parameter, out p)) errors.Add("parameter", VocabularyMessages.UnknownParameter(Parameter));
        if (Statistic is not null && !StatisticKindNames.TryParse(Statistic, out s)) errors.Add("statistic", VocabularyMessages.UnknownStatistic(Statistic));
        if (Period is not null && !AtlasPeriod.TryParse(Period, out t)) errors.Add("period", VocabularyMessages.UnknownPeriod(Period));
        var level = QueryNumbers.Read("threshold", Threshold, "the threshold in the layer's unit, e.g. threshold=20", errors, required: false);
        return errors.Count > 0 ? null : (p, s, t, level);
    }
}
