namespace Atlas.Api.Vocabulary;

/// <summary>What the API says about each wave parameter and statistic: name and unit.</summary>
public static class ParameterCatalogue
{
    public static IReadOnlyList<ParameterItem> Items { get; } =
        WaveParameterNames.All.Select(p => new ParameterItem(p.Symbol(), LongName(p), p.Unit())).ToArray();

    public static string LongName(WaveParameter parameter) => parameter switch
    {
        WaveParameter.Hs => "significant wave height Hm0",
        WaveParameter.Te => "energy period Tm-1,0",
        WaveParameter.Tp => "peak period",
        WaveParameter.J => "omnidirectional wave power",
        WaveParameter.Dir => "mean direction waves come from (power-weighted, degrees true)",
        WaveParameter.Spread => "directional spread",
        WaveParameter.D => "directionality coefficient",
        WaveParameter.Depth => "still-water depth",
        _ => parameter.Symbol(),
    };

    /// <summary>The unit of a statistic of a parameter: the parameter's unit, or 1 for count and coverage.</summary>
    public static string UnitOf(WaveParameter parameter, StatisticKind statistic) =>
        statistic is StatisticKind.Count or StatisticKind.Coverage ? "1" : parameter.Unit();

    public static string StatisticLongName(StatisticKind statistic) => statistic switch
    {
        StatisticKind.Mean => "mean",
        StatisticKind.Sd => "standard deviation",
        StatisticKind.Min => "minimum",
        StatisticKind.Max => "maximum",
        StatisticKind.P10 => "10th percentile",
        StatisticKind.P50 => "median",
        StatisticKind.P90 => "90th percentile",
        StatisticKind.P99 => "99th percentile",
        StatisticKind.Count => "number of valid steps",
        StatisticKind.Coverage => "coverage (valid over expected steps)",
        _ => statistic.Name(),
    };

    /// <summary>
    /// The statistics a parameter's layers have: all for summarised parameters; for dir the power-weighted mean, the
    /// circular spread of directions (as sd), count and coverage; for d the period coefficient (as mean), count and
    /// coverage; for depth the cell depth (as mean).
    /// </summary>
    public static IReadOnlyList<StatisticKind> StatisticsOf(WaveParameter parameter) => parameter switch
    {
        WaveParameter.Dir => [StatisticKind.Mean, StatisticKind.Sd, StatisticKind.Count, StatisticKind.Coverage],
        WaveParameter.D => [StatisticKind.Mean, StatisticKind.Count, StatisticKind.Coverage],
        WaveParameter.Depth => [StatisticKind.Mean],
        _ => StatisticKindNames.All,
    };
}
