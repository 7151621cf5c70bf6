using System.Globalization;
using System.Text.RegularExpressions;

namespace Atlas.Browser.Tests;

/// <summary>Compares a number as the page shows it with the API's value, allowing only the rounding of the display.</summary>
public static partial class ShownNumber
{
    [GeneratedRegex(@"-?\d[\d,]*(\.\d+)?")]
    private static partial Regex NumberPattern();

    /// <summary>The first number in a text ("82.3 m" gives 82.3; thousands separators are dropped).</summary>
    public static (double Value, int Decimals) Parse(string text)
    {
        var match = NumberPattern().Match(text);
        Assert.True(match.Success, $"no number in '{text}'");
        var digits = match.Value.Replace(",", "");
        var decimals = digits.Contains('.') ? digits.Length - digits.IndexOf('.') - 1 : 0;
        return (double.Parse(digits, CultureInfo.InvariantCulture), decimals);
    }

    /// <summary>Asserts that <paramref name="shown"/> is <paramref name="expected"/> rounded to the decimals it shows.</summary>
    public static void Matches(double expected, string shown, string what)
    {
        var (value, decimals) = Parse(shown);
        Within(expected, value, 0.5 * Math.Pow(10, -decimals), shown, what);
    }

    /// <summary>
    /// Asserts that <paramref name="shown"/> gives <paramref name="expected"/> to <paramref name="decimals"/> decimals:
    /// it shows at least that many, and differs from the value by at most half a unit of the last of them.
    /// </summary>
    public static void MatchesTo(int decimals, double expected, string shown, string what)
    {
        var (value, shownDecimals) = Parse(shown);
        Assert.True(shownDecimals >= decimals, $"{what}: the page shows '{shown}', fewer than {decimals} decimals");
        Within(expected, value, 0.5 * Math.Pow(10, -decimals), shown, what);
    }

    private static void Within(double expected, double value, double halfUnit, string shown, string what) =>
        Assert.True(Math.Abs(value - expected) <= halfUnit * (1 + 1e-9),
            $"{what}: the page shows '{shown}', the API says {expected.ToString("R", CultureInfo.InvariantCulture)} (tolerance {halfUnit}, the display rounding)");
}
