using System.Globalization;
using System.Text.Json;
using Atlas.TestSupport;

namespace Atlas.Hindcast.Tests;

public sealed class CfTimeTests
{
    private readonly NetCdfFixtures _fixtures = NetCdfFixtures.Shared;

    private static readonly (string Units, string Calendar, double[] Values)[] Cases =
    [
        ("seconds since 1970-01-01 00:00:00", "standard", [0, 86399.5, 1e9]),
        ("hours since 2001-01-01 00:00:00", "gregorian", [0, 8759, 8760, 0.25]),
        ("minutes since 2001-06-01T00:00:00Z", "standard", [0, 60, 1439]),
        ("days since 2001-1-1", "proleptic_gregorian", [0, 59, 365.5]),
        // The mixed calendar reads a reference before 1582-10-15 with Julian rules.
        ("days since 0001-01-01 00:00:00", "standard", [730000, 731000.25]),
        ("days since 0001-01-01", "proleptic_gregorian", [730000]),
        ("days since 1582-10-04", "standard", [1, 2]),
        ("days since 1990-01-01", "julian", [0, 1.5]),
        ("days since 2000-02-27", "noleap", [0, 1, 2, 3, 365]),
        ("minutes since 2000-02-28 12:00", "365_day", [720, 2160]),
        ("days since 2000-02-27", "all_leap", [0, 1, 2, 3]),
        ("hours since 1999-12-31 23:00:00", "366_day", [1, 25]),
        ("days since 2003-01-01", "noleap", [-1, -365]),
    ];

    [Fact]
    public void DecodedTimesAgreeWithCftime()
    {
        // Reference: cftime (netCDF4-python's date library) via cf_dates.py; real calendars compared as the
        // proleptic Gregorian dates of the same instants (cftime change_calendar), model calendars as dates. Exact to 1 ms.
        string input = JsonSerializer.Serialize(Cases.Select(c => new object[] { c.Units, c.Calendar, c.Values }));
        using var reference = JsonDocument.Parse(ExternalTool.Run(ExternalTool.Python, [NetCdfFixtures.Source("cf_dates.py")], input));
        for (int c = 0; c < Cases.Length; c++)
        {
            var (units, calendar, values) = Cases[c];
            var expected = reference.RootElement[c];
            var dates = expected.GetProperty("proleptic").ValueKind == JsonValueKind.Array ? expected.GetProperty("proleptic") : expected.GetProperty("dates");
            var decoded = CfTime.Parse(units, calendar).ToUtc(values);
            for (int k = 0; k < values.Length; k++)
            {
                var want = DateTime.Parse(dates[k].GetString()!, CultureInfo.InvariantCulture, DateTimeStyles.AdjustToUniversal | DateTimeStyles.AssumeUniversal);
                Assert.True(want == decoded[k], $"'{units}' ({calendar}) value {values[k]}: cftime {want:o}, decoded {decoded[k]:o}");
                Assert.Equal(DateTimeKind.Utc, decoded[k].Kind);
            }
        }
    }

    [Fact]
    public void NoleapFileDecodesToTheDatesCftimeGivesAndSkipsTheLeapDay()
    {
        using var file = HindcastFile.Open(_fixtures.Path("calendar_noleap.classic"));
        var cftime = _fixtures.ReadBack("calendar_noleap.classic").GetProperty("times").EnumerateArray()
            .Select(d => DateTime.Parse(d.GetString()!, CultureInfo.InvariantCulture, DateTimeStyles.AdjustToUniversal | DateTimeStyles.AssumeUniversal)).ToArray();
        Assert.Equal(cftime, file.TimesUtc);
        Assert.Equal(new DateTime(2000, 3, 1, 0, 0, 0, DateTimeKind.Utc), file.TimesUtc[2]);
    }

    [Fact]
    public void ZoneOffsetInTheReferenceShiftsTimesToUtc()
    {
        // UDUNITS-2 manual: a reference time may carry a zone offset, "seconds since 1992-10-8 15:15:42.5 -6:00"
        // (example from memory), meaning 21:15:42.5 UTC.
        var utc = CfTime.Parse("seconds since 1992-10-8 15:15:42.5 -6:00", null).ToUtc(0);
        Assert.Equal(new DateTime(1992, 10, 8, 21, 15, 42, 500, DateTimeKind.Utc), utc);
        Assert.Equal(new DateTime(2001, 1, 1, 0, 0, 0, DateTimeKind.Utc), CfTime.Parse("hours since 2001-01-01 05:30 +05:30", "").ToUtc(0));
    }

    [Fact]
    public void AllLeapTwentyNinthOfFebruaryInACommonYearIsRejectedWithItsIndex()
    {
        string path = _fixtures.Path("calendar_all_leap.classic");
        var e = Assert.Throws<HindcastFormatException>(() => HindcastFile.Open(path));
        Assert.Equal("time", e.Variable);
        Assert.Contains("time[2]", e.Problem);
        Assert.Contains("2001-02-29", e.Problem);
    }

    [Fact]
    public void ThreeHundredSixtyDayCalendarIsRejected()
    {
        string path = _fixtures.Path("calendar_360_day.classic");
        var e = Assert.Throws<HindcastFormatException>(() => HindcastFile.Open(path));
        Assert.Equal("time", e.Variable);
        Assert.Contains("calendar '360_day'", e.Message);
        Assert.StartsWith(path + ": variable 'time': ", e.Message);
    }

    [Fact]
    public void OutOfOrderStepIsRejectedNamingItsIndexAndTime()
    {
        var e = Assert.Throws<HindcastFormatException>(() => HindcastFile.Open(_fixtures.Path("time_nonmonotonic.classic")));
        Assert.Equal("time", e.Variable);
        Assert.Equal("time[3] = 2001-01-01T02:00:00Z is before time[2] = 2001-01-01T03:00:00Z; times must increase strictly", e.Problem);
    }

    [Fact]
    public void RepeatedStepIsRejectedNamingItsIndexAndTheLargestDifference()
    {
        var e = Assert.Throws<HindcastFormatException>(() => HindcastFile.Open(_fixtures.Path("time_duplicate.classic")));
        // time_duplicate.cdl (values as ncdump prints them): steps 1 and 2 hold hs 1.5, 1.75 and 2, 2.25 (0.5 m apart),
        // tp 9, 9.5 and 10, 10.5 (1 s apart).
        Assert.Equal("time[2] = 2001-01-01T01:00:00Z repeats time[1] = 2001-01-01T01:00:00Z; times must increase strictly; " +
                     "the two steps differ: variable 'hs' by up to 0.5 m (point 0), variable 'tp' by up to 1 s (point 0)", e.Problem);
    }

    [Theory]
    [InlineData("months since 2001-01-01", null, "no fixed length")]
    [InlineData("years since 2001-01-01", null, "no fixed length")]
    [InlineData("fortnights since 2001-01-01", null, "unknown time unit 'fortnights'")]
    [InlineData("hours after 2001-01-01", null, "not of the form")]
    [InlineData("hours since 2001-02-30", "proleptic_gregorian", "does not exist")]
    [InlineData("days since 2000-02-29", "noleap", "does not exist")]
    [InlineData("days since 1582-10-10", "standard", "do not exist")]
    [InlineData("hours since 2001-01-01", "360_day", "cannot be mapped to real UTC dates")]
    [InlineData("hours since 2001-01-01", "none", "no dates")]
    [InlineData("hours since 2001-01-01", "lunar", "not a CF calendar")]
    [InlineData(null, null, "no units")]
    public void UndecodableUnitsOrCalendarsAreRejectedWithTheReason(string? units, string? calendar, string reason)
    {
        var e = Assert.Throws<FormatException>(() => CfTime.Parse(units, calendar));
        Assert.Contains(reason, e.Message);
    }

    [Fact]
    public void NonFiniteTimeValueIsRejectedWithItsIndex()
    {
        var e = Assert.Throws<FormatException>(() => CfTime.Parse("hours since 2001-01-01", null).ToUtc([0, double.NaN]));
        Assert.StartsWith("time[1]:", e.Message);
    }
}
