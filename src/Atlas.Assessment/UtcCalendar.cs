namespace Atlas.Assessment;

/// <summary>Calendar arithmetic on Unix seconds, always in UTC.</summary>
public static class UtcCalendar
{
    /// <summary>
    /// Mean length of a year used for annual totals: 365.25 days = 8766 h (the Julian year, which
    /// averages leap years in the record).
    /// </summary>
    public const double HoursPerMeanYear = 8766.0;

    /// <summary>The UTC date and time of a Unix time.</summary>
    public static DateTime ToDateTime(long unixSeconds) => DateTime.UnixEpoch.AddSeconds(unixSeconds);

    /// <summary>Unix seconds of a UTC date and time.</summary>
    public static long ToUnixSeconds(DateTime utc) => (long)(utc - DateTime.UnixEpoch).TotalSeconds;

    /// <summary>Calendar month 1..12 of a Unix time.</summary>
    public static int MonthOf(long unixSeconds) => ToDateTime(unixSeconds).Month;

    /// <summary>Calendar year of a Unix time.</summary>
    public static int YearOf(long unixSeconds) => ToDateTime(unixSeconds).Year;

    /// <summary>Season of a calendar month 1..12.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The month is outside 1..12.</exception>
    public static CalendarSeason SeasonOf(int month) => month switch
    {
        12 or 1 or 2 => CalendarSeason.Djf,
        3 or 4 or 5 => CalendarSeason.Mam,
        6 or 7 or 8 => CalendarSeason.Jja,
        9 or 10 or 11 => CalendarSeason.Son,
        _ => throw new ArgumentOutOfRangeException(nameof(month), month, "A calendar month is 1..12."),
    };

    /// <summary>Hours in a given calendar year (8760 or 8784).</summary>
    public static double HoursInYear(int year) => (DateTime.IsLeapYear(year) ? 366 : 365) * 24.0;

    /// <summary>Hours in a given month of a given year.</summary>
    public static double HoursInMonth(int year, int month) => DateTime.DaysInMonth(year, month) * 24.0;

    /// <summary>
    /// Mean length of a calendar month in hours, February counted as 28.25 days so that the
    /// twelve months add up to <see cref="HoursPerMeanYear"/>.
    /// </summary>
    public static double MeanHoursInMonth(int month) =>
        month == 2 ? 28.25 * 24.0 : DateTime.DaysInMonth(2001, month) * 24.0;
}
