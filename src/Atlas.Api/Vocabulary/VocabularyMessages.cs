namespace Atlas.Api.Vocabulary;

/// <summary>What to say when a request names a parameter, statistic or period the atlas does not have.</summary>
public static class VocabularyMessages
{
    public static string UnknownParameter(string text) =>
        $"'{text}' is not a parameter: use one of {string.Join(", ", WaveParameterNames.All.Select(p => p.Symbol()))}.";

    public static string UnknownStatistic(string text) =>
        $"'{text}' is not a statistic: use one of {string.Join(", ", StatisticKindNames.All.Select(s => s.Name()))}.";

    public static string UnknownPeriod(string text) =>
        $"'{text}' is not a period: use jan..dec, djf, mam, jja, son, annual, or y followed by a four-digit year (y2019).";
}
