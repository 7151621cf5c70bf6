using System.Globalization;
using System.Text.RegularExpressions;

namespace Atlas.Hindcast;

/// <summary>CF calendars that can be mapped onto real UTC instants.</summary>
public enum CfCalendar
{
    /// <summary>"standard"/"gregorian": Julian before 1582-10-15, Gregorian from then on (the mixed calendar).</summary>
    Standard,
    /// <summary>"proleptic_gregorian": Gregorian rules extended backwards.</summary>
    ProlepticGregorian,
    /// <summary>"julian": Julian rules throughout.</summary>
    Julian,
    /// <summary>"noleap"/"365_day": no 29 February; model dates are read as the same real calendar date.</summary>
    NoLeap,
    /// <summary>"all_leap"/"366_day": 29 February every year; a 29 February in a real non-leap year is rejected.</summary>
    AllLeap,
}

/// <summary>
/// A CF time coordinate's "&lt;unit&gt; since &lt;reference&gt;" units and calendar, decoded to UTC <see cref="DateTime"/>s.
/// </summary>
/// <remarks>
/// For "standard"/"gregorian" the reference date is read with the Julian rules when it falls before 1582-10-15,
/// as CF defines; the elapsed time is then real time, so for hindcast dates (after 1582) the result is the
/// proleptic Gregorian date that DateTime holds. For "noleap"/"all_leap" the value is counted in the model
/// calendar and the resulting model date and time of day are taken as the real UTC date and time: every noleap
/// date exists in the real calendar (steps simply skip 29 February), while an all_leap 29 February in a non-leap
/// year has no real date and is rejected. "360_day" (30-day months) and "none" are rejected: they have no
/// faithful mapping to real dates. Months and years are rejected as units: their length is not fixed.
/// Decoded instants are rounded to the nearest millisecond, which absorbs float32 storage of hour fractions.
/// </remarks>
public sealed class CfTime
{
    private const long MillisecondsPerDay = 86_400_000;
    private static readonly int[] CumulativeDaysNoLeap = [0, 31, 59, 90, 120, 151, 181, 212, 243, 273, 304, 334, 365];
    private static readonly int[] CumulativeDaysAllLeap = [0, 31, 60, 91, 121, 152, 182, 213, 244, 274, 305, 335, 366];

    private static readonly Regex UnitsPattern = new(
        @"^\s*(?<unit>[A-Za-z]+)\s+since\s+(?<y>[-+]?\d{1,5})-(?<mo>\d{1,2})-(?<d>\d{1,2})" +
        @"(?:[ T]+(?<h>\d{1,2})(?::(?<mi>\d{1,2})(?::(?<s>\d{1,2}(?:\.\d*)?))?)?)?" +
        @"\s*(?<tz>Z|UTC|GMT|[-+]\d{1,2}(?::?\d{2})?)?\s*$",
        RegexOptions.CultureInvariant | RegexOptions.IgnoreCase);

    private readonly long _referenceMilliseconds; // in the calendar's own day count (see ToUtc)

    private CfTime(string units, CfCalendar calendar, double millisecondsPerUnit, long referenceMilliseconds, long utcOffsetMilliseconds)
    {
        Units = units;
        Calendar = calendar;
        MillisecondsPerUnit = millisecondsPerUnit;
        _referenceMilliseconds = referenceMilliseconds - utcOffsetMilliseconds;
    }

    public string Units { get; }
    public CfCalendar Calendar { get; }

    /// <summary>Length of one unit of the time value in milliseconds (3,600,000 for hours).</summary>
    public double MillisecondsPerUnit { get; }

    /// <summary>
    /// Parses CF time units and a calendar attribute (null or empty means "standard").
    /// Throws <see cref="FormatException"/> with the reason for units or calendars that cannot be decoded.
    /// </summary>
    public static CfTime Parse(string? units, string? calendar)
    {
        var cal = ParseCalendar(calendar);
        if (string.IsNullOrWhiteSpace(units)) throw new FormatException("time has no units attribute ('<unit> since <date>' is required)");
        var m = UnitsPattern.Match(units);
        if (!m.Success) throw new FormatException($"time units '{units}' are not of the form '<unit> since <yyyy-mm-dd[ hh:mm:ss][ zone]>'");

        double msPerUnit = m.Groups["unit"].Value.ToLowerInvariant() switch
        {
            "s" or "sec" or "secs" or "second" or "seconds" => 1000,
            "min" or "mins" or "minute" or "minutes" => 60_000,
            "h" or "hr" or "hrs" or "hour" or "hours" => 3_600_000,
            "d" or "day" or "days" => MillisecondsPerDay,
            "week" or "weeks" => 7 * MillisecondsPerDay,
            "month" or "months" or "year" or "years" or "common_year" or "common_years" =>
                throw new FormatException($"time units '{units}': months and years have no fixed length and are not accepted"),
            var other => throw new FormatException($"time units '{units}': unknown time unit '{other}'"),
        };

        int year = int.Parse(m.Groups["y"].Value, CultureInfo.InvariantCulture);
        int month = int.Parse(m.Groups["mo"].Value, CultureInfo.InvariantCulture);
        int day = int.Parse(m.Groups["d"].Value, CultureInfo.InvariantCulture);
        int hour = m.Groups["h"].Success ? int.Parse(m.Groups["h"].Value, CultureInfo.InvariantCulture) : 0;
        int minute = m.Groups["mi"].Success ? int.Parse(m.Groups["mi"].Value, CultureInfo.InvariantCulture) : 0;
        double second = m.Groups["s"].Success ? double.Parse(m.Groups["s"].Value, CultureInfo.InvariantCulture) : 0;
        if (month is < 1 or > 12 || day < 1 || hour > 23 || minute > 59 || second >= 61)
            throw new FormatException($"time units '{units}': reference date/time is out of range");

        long dayNumber = DayNumber(cal, year, month, day, units);
        long reference = dayNumber * MillisecondsPerDay + (hour * 3600L + minute * 60L) * 1000 + (long)Math.Round(second * 1000);
        return new CfTime(units, cal, msPerUnit, reference, ParseZone(m.Groups["tz"].Value));
    }

    /// <summary>The UTC instant of one time value. Throws <see cref="FormatException"/> for NaN/infinite values or dates that do not exist.</summary>
    public DateTime ToUtc(double value)
    {
        if (!double.IsFinite(value)) throw new FormatException($"time value {value} is not a finite number");
        double offset = Math.Round(value * MillisecondsPerUnit);
        if (Math.Abs(offset) > 4e14) throw new FormatException($"time value {value} ({Units}) is outside years 1..9999");
        long ms = _referenceMilliseconds + (long)offset;
        return Calendar switch
        {
            CfCalendar.NoLeap or CfCalendar.AllLeap => ModelCalendarToUtc(ms, value),
            _ => FromUnixMilliseconds(ms, value),
        };
    }

    /// <summary>Decodes every value; the exception message names the offending index.</summary>
    public DateTime[] ToUtc(ReadOnlySpan<double> values)
    {
        var result = new DateTime[values.Length];
        for (int i = 0; i < values.Length; i++)
        {
            try
            {
                result[i] = ToUtc(values[i]);
            }
            catch (FormatException e)
            {
                throw new FormatException($"time[{i}]: {e.Message}", e);
            }
        }
        return result;
    }

    /// <summary>
    /// Throws <see cref="FormatException"/> naming the first index whose time is not strictly after the one before it
    /// (a duplicate or out-of-order step).
    /// </summary>
    public static void RequireStrictlyIncreasing(IReadOnlyList<DateTime> times)
    {
        for (int i = 1; i < times.Count; i++)
        {
            if (times[i] > times[i - 1]) continue;
            string what = times[i] == times[i - 1] ? "repeats" : "is before";
            throw new FormatException(
                $"time[{i}] = {Iso(times[i])} {what} time[{i - 1}] = {Iso(times[i - 1])}; times must increase strictly");
        }
    }

    /// <summary>ISO 8601 text of a UTC instant, e.g. "2001-01-01T03:00:00Z".</summary>
    public static string Iso(DateTime utc) =>
        utc.ToString(utc.Millisecond == 0 ? "yyyy-MM-dd'T'HH:mm:ss'Z'" : "yyyy-MM-dd'T'HH:mm:ss.fff'Z'", CultureInfo.InvariantCulture);

    private static CfCalendar ParseCalendar(string? calendar) => (calendar ?? "").Trim().ToLowerInvariant() switch
    {
        "" or "standard" or "gregorian" => CfCalendar.Standard,
        "proleptic_gregorian" => CfCalendar.ProlepticGregorian,
        "julian" => CfCalendar.Julian,
        "noleap" or "365_day" => CfCalendar.NoLeap,
        "all_leap" or "366_day" => CfCalendar.AllLeap,
        "360_day" => throw new FormatException(
            "calendar '360_day' (twelve 30-day months) cannot be mapped to real UTC dates: 30 February has no real date " +
            "and real 31st days have no model date; the atlas needs a real-calendar hindcast"),
        "none" => throw new FormatException("calendar 'none' has no dates; the atlas needs a dated time axis"),
        var other => throw new FormatException($"calendar '{calendar}' is not a CF calendar this reader knows ('{other}')"),
    };

    private static long ParseZone(string zone)
    {
        if (zone.Length == 0 || zone.Equals("Z", StringComparison.OrdinalIgnoreCase) ||
            zone.Equals("UTC", StringComparison.OrdinalIgnoreCase) || zone.Equals("GMT", StringComparison.OrdinalIgnoreCase)) return 0;
        int sign = zone[0] == '-' ? -1 : 1;
        string body = zone[1..].Replace(":", "");
        int hours, minutes = 0;
        if (body.Length <= 2) hours = int.Parse(body, CultureInfo.InvariantCulture);
        else
        {
            hours = int.Parse(body[..^2], CultureInfo.InvariantCulture);
            minutes = int.Parse(body[^2..], CultureInfo.InvariantCulture);
        }
        return sign * (hours * 60L + minutes) * 60_000;
    }

    /// <summary>
    /// Day number of the reference date. For the real calendars it is days since 1970-01-01 (proleptic Gregorian),
    /// so the instant arithmetic is plain; for noleap/all_leap it is days since model year 0.
    /// </summary>
    private static long DayNumber(CfCalendar calendar, int year, int month, int day, string units)
    {
        switch (calendar)
        {
            case CfCalendar.ProlepticGregorian:
                RequireDayInMonth(day, GregorianMonthLength(year, month), units);
                return DaysFromGregorian(year, month, day);
            case CfCalendar.Julian:
                RequireDayInMonth(day, JulianMonthLength(year, month), units);
                return DaysFromJulian(year, month, day);
            case CfCalendar.Standard:
                if ((year, month, day).CompareTo((1582, 10, 15)) >= 0)
                {
                    RequireDayInMonth(day, GregorianMonthLength(year, month), units);
                    return DaysFromGregorian(year, month, day);
                }
                if ((year, month, day).CompareTo((1582, 10, 4)) > 0)
                    throw new FormatException($"time units '{units}': 1582-10-05..14 do not exist in the standard calendar");
                RequireDayInMonth(day, JulianMonthLength(year, month), units);
                return DaysFromJulian(year, month, day);
            case CfCalendar.NoLeap:
                RequireDayInMonth(day, CumulativeDaysNoLeap[month] - CumulativeDaysNoLeap[month - 1], units);
                return year * 365L + CumulativeDaysNoLeap[month - 1] + day - 1;
            default:
                RequireDayInMonth(day, CumulativeDaysAllLeap[month] - CumulativeDaysAllLeap[month - 1], units);
                return year * 366L + CumulativeDaysAllLeap[month - 1] + day - 1;
        }
    }

    private static void RequireDayInMonth(int day, int length, string units)
    {
        if (day > length) throw new FormatException($"time units '{units}': the reference date does not exist in its calendar");
    }

    private DateTime ModelCalendarToUtc(long modelMs, double value)
    {
        bool allLeap = Calendar == CfCalendar.AllLeap;
        int yearLength = allLeap ? 366 : 365;
        long dayNumber = Math.DivRem(modelMs, MillisecondsPerDay, out long msOfDay);
        if (msOfDay < 0)
        {
            msOfDay += MillisecondsPerDay;
            dayNumber--;
        }
        long year = Math.DivRem(dayNumber, yearLength, out long dayOfYear);
        if (dayOfYear < 0)
        {
            dayOfYear += yearLength;
            year--;
        }
        var cumulative = allLeap ? CumulativeDaysAllLeap : CumulativeDaysNoLeap;
        int month = 1;
        while (dayOfYear >= cumulative[month]) month++;
        int day = (int)(dayOfYear - cumulative[month - 1]) + 1;
        if (year is < 1 or > 9999) throw new FormatException($"time value {value} ({Units}) falls in year {year}, outside 1..9999");
        if (month == 2 && day == 29 && !DateTime.IsLeapYear((int)year))
            throw new FormatException(
                $"time value {value} ({Units}, calendar all_leap) falls on {year:D4}-02-29, which does not exist in the real calendar");
        return new DateTime((int)year, month, day, 0, 0, 0, DateTimeKind.Utc).AddMilliseconds(msOfDay);
    }

    private DateTime FromUnixMilliseconds(long ms, double value)
    {
        const long min = -62_135_596_800_000; // 0001-01-01
        const long max = 253_402_300_799_999; // 9999-12-31T23:59:59.999
        if (ms is < min or > max) throw new FormatException($"time value {value} ({Units}) is outside years 1..9999");
        return DateTime.UnixEpoch.AddMilliseconds(ms);
    }

    // Days since 1970-01-01 for a proleptic Gregorian date (H. Hinnant's days_from_civil).
    private static long DaysFromGregorian(long y, int m, int d)
    {
        y -= m <= 2 ? 1 : 0;
        long era = (y >= 0 ? y : y - 399) / 400;
        long yoe = y - era * 400;
        long doy = (153 * (m + (m > 2 ? -3 : 9)) + 2) / 5 + d - 1;
        long doe = yoe * 365 + yoe / 4 - yoe / 100 + doy;
        return era * 146097 + doe - 719468;
    }

    // Days since 1970-01-01 (proleptic Gregorian) for a Julian-calendar date, via the Julian day number.
    private static long DaysFromJulian(long y, int m, int d)
    {
        long a = (14 - m) / 12;
        long yy = y + 4800 - a;
        long mm = m + 12 * a - 3;
        long jdn = d + (153 * mm + 2) / 5 + 365 * yy + FloorDiv(yy, 4) - 32083;
        return jdn - 2440588; // JDN of 1970-01-01
    }

    private static long FloorDiv(long a, long b) => a >= 0 ? a / b : -((-a + b - 1) / b);

    private static int GregorianMonthLength(int year, int month) =>
        month == 2 ? (year % 4 == 0 && (year % 100 != 0 || year % 400 == 0) ? 29 : 28) : JulianMonthLength(year, month);

    private static int JulianMonthLength(int year, int month) => month switch
    {
        2 => year % 4 == 0 ? 29 : 28,
        4 or 6 or 9 or 11 => 30,
        _ => 31,
    };
}
