namespace Atlas.Statistics.Calendar;

/// <summary>
/// Lengths of calendar years and months in hours (UTC, proleptic Gregorian), and the mean lengths used to turn a
/// mean power into an energy per year or per month of the climate.
/// </summary>
public static class CalendarHours
{
    /// <summary>
    /// Mean length of a year used for annual totals: 365.25 days = 8766 h (the Julian year, which averages leap
    /// years in the record).
    /// </summary>
    public const double PerMeanYear = 8766.0;

    /// <summary>Hours in a calendar year (8760 or 8784).</summary>
    public static double InYear(int year) => (DateTime.IsLeapYear(year) ? 366 : 365) * 24.0;

    /// <summary>Hours in a month (1 = January) of a calendar year.</summary>
    public static double InMonth(int year, int month) => DateTime.DaysInMonth(year, month) * 24.0;

    /// <summary>
    /// Mean length of a calendar month (1 = January) in hours, February counted as 28.25 days so that the twelve
    /// months add up to <see cref="PerMeanYear"/>.
    /// </summary>
    public static double InMeanMonth(int month) =>
        month == 2 ? 28.25 * 24.0 : DateTime.DaysInMonth(2001, month) * 24.0;
}
