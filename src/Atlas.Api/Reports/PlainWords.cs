using System.Text.RegularExpressions;

namespace Atlas.Api.Reports;

/// <summary>
/// Turns the identifiers that method notes and recorded assumptions carry (option values, keys in snake case, enum
/// names) into the words a reader of a report expects; text without them passes unchanged.
/// </summary>
public static partial class PlainWords
{
    private static readonly (string Identifier, string Words)[] Known =
    [
        ("JonswapGamma33", "a JONSWAP spectrum with peak enhancement 3.3"),
        ("PiersonMoskowitz", "a Pierson-Moskowitz spectrum"),
        ("HyndmanFanType7", "Hyndman and Fan's type 7, linear interpolation between order statistics"),
        ("DerivedFromPeakPeriod", "derived from the peak period"),
    ];

    public static string Of(string text)
    {
        foreach (var (identifier, words) in Known) text = text.Replace(identifier, words, StringComparison.Ordinal);
        // snake_case keys (energy_period, inter_annual) read as words.
        text = SnakeCase().Replace(text, m => m.Value.Replace('_', ' '));
        // A remaining CamelCase word made of two or more capitalised parts reads as lower-case words.
        return CamelCase().Replace(text, m => string.Join(' ', SplitCamel().Split(m.Value).Where(p => p.Length > 0)).ToLowerInvariant());
    }

    [GeneratedRegex(@"\b[a-z]+(?:_[a-z0-9]+)+\b")]
    private static partial Regex SnakeCase();

    [GeneratedRegex(@"\b(?:[A-Z][a-z]+){2,}\b")]
    private static partial Regex CamelCase();

    [GeneratedRegex(@"(?=[A-Z])")]
    private static partial Regex SplitCamel();
}
