namespace Atlas.Statistics.Results;

/// <summary>Every statistic of one cell or point over one period.</summary>
/// <param name="Period">The period.</param>
/// <param name="ExpectedSteps">Steps of the timeline that fall in the period (valid or not).</param>
/// <param name="Hs">Hm0, m.</param>
/// <param name="Te">Energy period, s (derived from Tp when so reported).</param>
/// <param name="Tp">Peak period, s.</param>
/// <param name="J">Omnidirectional power per step, kW/m.</param>
/// <param name="Spread">Directional spread per step, degrees.</param>
/// <param name="D">Directionality coefficient per step.</param>
/// <param name="Direction">Power-weighted mean direction, spread of directions and power rose.</param>
/// <param name="HsExceedance">Fraction of steps with Hs above each threshold of <see cref="StatisticsOptions.HsThresholdsMetres"/>.</param>
/// <param name="PowerExceedance">Fraction of steps with J above each threshold of <see cref="StatisticsOptions.PowerThresholdsKilowattsPerMetre"/>.</param>
/// <param name="LowCoverage">True when the coverage of the core series (J when power can be computed, else Hs) is below
/// <see cref="StatisticsOptions.LowCoverageThreshold"/>: flagged, not hidden.</param>
public sealed record PeriodStatistics(
    AtlasPeriod Period,
    long ExpectedSteps,
    SummaryStatistics Hs,
    SummaryStatistics Te,
    SummaryStatistics Tp,
    SummaryStatistics J,
    SummaryStatistics Spread,
    SummaryStatistics D,
    DirectionStatistics Direction,
    IReadOnlyList<ExceedanceFraction> HsExceedance,
    IReadOnlyList<ExceedanceFraction> PowerExceedance,
    bool LowCoverage)
{
    /// <summary>The summary of a parameter that has one (hs, te, tp, j, spread, d).</summary>
    /// <exception cref="ArgumentException">dir and depth have no summary (see <see cref="Direction"/> and the cell depth).</exception>
    public SummaryStatistics Summary(WaveParameter parameter) => ParameterSummaries.Pick(parameter, Hs, Te, Tp, J, Spread, D);

    /// <summary>
    /// One value for a layer: a statistic of a summarised parameter, or for dir the power-weighted mean (mean),
    /// the count and the coverage; NaN for any other combination and for depth (a property of the cell).
    /// </summary>
    public double Value(WaveParameter parameter, StatisticKind statistic) => parameter switch
    {
        WaveParameter.Dir => statistic switch
        {
            StatisticKind.Mean => Direction.Mean,
            StatisticKind.Count => Direction.Count,
            StatisticKind.Coverage => Direction.Coverage,
            _ => double.NaN,
        },
        WaveParameter.Depth => double.NaN,
        _ => Summary(parameter).Get(statistic),
    };
}
