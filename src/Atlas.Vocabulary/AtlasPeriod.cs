using System.Text.Json.Serialization;

namespace Atlas.Vocabulary;

/// <summary>
/// A climatological or single-year period of the atlas: jan..dec, djf, mam, jja, son, annual, or one year (y2019).
/// </summary>
/// <remarks>
/// Calendar months are taken in UTC. A month or a season gathers its calendar months across all years of the
/// record: DJF is every December, January and February by calendar month, not a winter shifted across the year
/// boundary (so January 2001 and December 2001 both belong to DJF; CDO's yseasmean groups the same way). A year
/// period is the calendar year in UTC. The stored code is a short: annual 0, months 1..12, djf 13, mam 14, jja 15,
/// son 16, a year its number (1000..9999). The default value is <see cref="Annual"/>. Serialises to JSON as its name.
/// </remarks>
[JsonConverter(typeof(AtlasPeriodJsonConverter))]
public readonly record struct AtlasPeriod : IComparable<AtlasPeriod>
{
    /// <summary>Smallest year a year period may name.</summary>
    public const int FirstYear = 1000;

    /// <summary>Largest year a year period may name.</summary>
    public const int LastYear = 9999;

    private const short DjfCode = 13, MamCode = 14, JjaCode = 15, SonCode = 16;

    private static readonly string[] MonthNames = ["jan", "feb", "mar", "apr", "may", "jun", "jul", "aug", "sep", "oct", "nov", "dec"];
    private static readonly string[] SeasonNames = ["djf", "mam", "jja", "son"];
    private static readonly int[][] SeasonMonths = [[12, 1, 2], [3, 4, 5], [6, 7, 8], [9, 10, 11]];
    private static readonly int[] AllMonths = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12];

    private AtlasPeriod(short code) => Code = code;

    /// <summary>The stored code (see remarks).</summary>
    public short Code { get; }

    /// <summary>Every step of the record (code 0).</summary>
    public static AtlasPeriod Annual => default;

    /// <summary>December, January, February of all years.</summary>
    public static AtlasPeriod Djf => new(DjfCode);

    /// <summary>March, April, May of all years.</summary>
    public static AtlasPeriod Mam => new(MamCode);

    /// <summary>June, July, August of all years.</summary>
    public static AtlasPeriod Jja => new(JjaCode);

    /// <summary>September, October, November of all years.</summary>
    public static AtlasPeriod Son => new(SonCode);

    /// <summary>The 17 climatological periods, in this order: jan..dec, djf, mam, jja, son, annual.</summary>
    public static IReadOnlyList<AtlasPeriod> StandardPeriods { get; } =
        [.. Enumerable.Range(1, 16).Select(c => new AtlasPeriod((short)c)), Annual];

    /// <summary>One calendar month (1 = January) across all years.</summary>
    public static AtlasPeriod Month(int month) =>
        month is >= 1 and <= 12 ? new AtlasPeriod((short)month) : throw new ArgumentOutOfRangeException(nameof(month), month, "Month must be 1..12.");

    /// <summary>The season holding a calendar month (1 = January): December, January and February give DJF.</summary>
    public static AtlasPeriod SeasonOf(int month) =>
        month is >= 1 and <= 12 ? new AtlasPeriod((short)(DjfCode + month % 12 / 3)) : throw new ArgumentOutOfRangeException(nameof(month), month, "Month must be 1..12.");

    /// <summary>One calendar year.</summary>
    public static AtlasPeriod Year(int year) =>
        year is >= FirstYear and <= LastYear ? new AtlasPeriod((short)year) : throw new ArgumentOutOfRangeException(nameof(year), year, $"Year must be {FirstYear}..{LastYear}.");

    /// <summary>The period with a stored code.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The code is 17..999 or outside 0..9999.</exception>
    public static AtlasPeriod FromCode(short code) =>
        code is >= 0 and <= SonCode or >= FirstYear and <= LastYear
            ? new AtlasPeriod(code)
            : throw new ArgumentOutOfRangeException(nameof(code), code, $"Period code must be 0 (annual), 1..12 (months), 13..16 (seasons) or a year {FirstYear}..{LastYear}.");

    /// <summary>What the period gathers.</summary>
    public PeriodKind Kind => Code switch
    {
        0 => PeriodKind.Annual,
        <= 12 => PeriodKind.Month,
        <= SonCode => PeriodKind.Season,
        _ => PeriodKind.Year,
    };

    /// <summary>The name: "jan".."dec", "djf", "mam", "jja", "son", "annual", "y2019".</summary>
    public string Name => Kind switch
    {
        PeriodKind.Annual => "annual",
        PeriodKind.Month => MonthNames[Code - 1],
        PeriodKind.Season => SeasonNames[Code - DjfCode],
        _ => "y" + Code.ToString(System.Globalization.CultureInfo.InvariantCulture),
    };

    /// <summary>The calendar months (1 = January) the period takes from each year it covers; all twelve for annual and years.</summary>
    public IReadOnlyList<int> Months => Kind switch
    {
        PeriodKind.Month => [Code],
        PeriodKind.Season => SeasonMonths[Code - DjfCode],
        _ => AllMonths,
    };

    /// <summary>The year of a year period; null for the climatological ones.</summary>
    public int? YearNumber => Kind == PeriodKind.Year ? Code : null;

    /// <summary>True when a step in this calendar year and month (1 = January) belongs to the period.</summary>
    public bool Contains(int year, int month) => Kind switch
    {
        PeriodKind.Annual => true,
        PeriodKind.Month => month == Code,
        PeriodKind.Season => month is >= 1 and <= 12 && DjfCode + month % 12 / 3 == Code,
        _ => year == Code,
    };

    /// <summary>True when the instant belongs to the period. Local times are converted to UTC; unspecified ones are taken as UTC.</summary>
    public bool Contains(DateTime utc)
    {
        DateTime t = utc.Kind == DateTimeKind.Local ? utc.ToUniversalTime() : utc;
        return Contains(t.Year, t.Month);
    }

    /// <summary>True when the instant, in Unix seconds (UTC), belongs to the period.</summary>
    public bool ContainsUnixSeconds(long unixSeconds) => Contains(DateTimeOffset.FromUnixTimeSeconds(unixSeconds).UtcDateTime);

    /// <summary>Parses a period name, ignoring case and surrounding spaces.</summary>
    /// <exception cref="FormatException">The text names no period; the message says what is accepted.</exception>
    public static AtlasPeriod Parse(string text) =>
        TryParse(text, out AtlasPeriod period, out string? error) ? period : throw new FormatException(error);

    /// <summary>Parses a period name, ignoring case and surrounding spaces; false for anything else, including null.</summary>
    public static bool TryParse(string? text, out AtlasPeriod period) => TryParse(text, out period, out _);

    private static bool TryParse(string? text, out AtlasPeriod period, out string? error)
    {
        period = default;
        error = null;
        string name = (text ?? "").Trim().ToLowerInvariant();
        int month = Array.IndexOf(MonthNames, name);
        if (month >= 0) { period = new AtlasPeriod((short)(month + 1)); return true; }
        int season = Array.IndexOf(SeasonNames, name);
        if (season >= 0) { period = new AtlasPeriod((short)(DjfCode + season)); return true; }
        if (name == "annual") return true;
        if (name.Length == 5 && name[0] == 'y' && name.AsSpan(1).IndexOfAnyExceptInRange('0', '9') < 0)
        {
            int year = int.Parse(name.AsSpan(1), System.Globalization.CultureInfo.InvariantCulture);
            if (year >= FirstYear) { period = new AtlasPeriod((short)year); return true; }
        }
        error = $"Unknown period '{text}': expected jan..dec, djf, mam, jja, son, annual, or a year as y followed by four digits ({FirstYear}..{LastYear}), e.g. y2019.";
        return false;
    }

    /// <summary>Orders months, then seasons, then annual, then years by year (the order of <see cref="StandardPeriods"/>).</summary>
    public int CompareTo(AtlasPeriod other) => SortKey.CompareTo(other.SortKey);

    private int SortKey => Code == 0 ? 17 : Code;

    /// <summary>The name.</summary>
    public override string ToString() => Name;
}
