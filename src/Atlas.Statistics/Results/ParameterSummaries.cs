namespace Atlas.Statistics.Results;

/// <summary>The one place that says which parameters have summary statistics per period, and which field is whose.</summary>
internal static class ParameterSummaries
{
    /// <summary>The summary of <paramref name="parameter"/> among a period's six (hs, te, tp, j, spread, d).</summary>
    /// <exception cref="ArgumentException">dir and depth have no summary.</exception>
    public static SummaryStatistics Pick(WaveParameter parameter, in SummaryStatistics hs, in SummaryStatistics te, in SummaryStatistics tp,
        in SummaryStatistics j, in SummaryStatistics spread, in SummaryStatistics d) => parameter switch
    {
        WaveParameter.Hs => hs,
        WaveParameter.Te => te,
        WaveParameter.Tp => tp,
        WaveParameter.J => j,
        WaveParameter.Spread => spread,
        WaveParameter.D => d,
        _ => throw new ArgumentException($"Parameter '{parameter.Symbol()}' has no summary statistics per period.", nameof(parameter)),
    };
}
