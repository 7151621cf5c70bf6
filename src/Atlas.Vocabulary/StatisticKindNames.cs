namespace Atlas.Vocabulary;

/// <summary>Names of <see cref="StatisticKind"/> as used in URLs and metadata, and the probabilities of the percentiles.</summary>
public static class StatisticKindNames
{
    private static readonly NameTable<StatisticKind> Names = new("statistic", ["mean", "sd", "min", "max", "p10", "p50", "p90", "p99", "count", "coverage"]);

    /// <summary>Every statistic, in declaration order.</summary>
    public static IReadOnlyList<StatisticKind> All { get; } = Enum.GetValues<StatisticKind>();

    /// <summary>The percentiles kept, in order, with their probabilities 0.10, 0.50, 0.90, 0.99.</summary>
    public static IReadOnlyList<(StatisticKind Kind, double Probability)> Percentiles { get; } =
        [(StatisticKind.P10, 0.10), (StatisticKind.P50, 0.50), (StatisticKind.P90, 0.90), (StatisticKind.P99, 0.99)];

    /// <summary>The name: "mean", "sd", "min", "max", "p10", "p50", "p90", "p99", "count", "coverage".</summary>
    public static string Name(this StatisticKind kind) => Names.NameOf(kind);

    /// <summary>Parses a name, ignoring case.</summary>
    /// <exception cref="FormatException">The text is not one of the names; the message lists them.</exception>
    public static StatisticKind Parse(string text) => Names.Parse(text);

    /// <summary>Parses a name, ignoring case; false for anything else, including null.</summary>
    public static bool TryParse(string? text, out StatisticKind kind) => Names.TryParse(text, out kind);
}
