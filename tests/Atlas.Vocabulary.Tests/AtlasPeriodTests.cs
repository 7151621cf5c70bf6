using System.Text.Json;

namespace Atlas.Vocabulary.Tests;

public class AtlasPeriodTests
{
    // The period vocabulary and stored codes of tests/data/README.md: months 1..12, djf 13, mam 14, jja 15, son 16, annual 0,
    // a year its number.
    [Theory]
    [InlineData("jan", 1)]
    [InlineData("DEC", 12)]
    [InlineData("djf", 13)]
    [InlineData("Mam", 14)]
    [InlineData("jja", 15)]
    [InlineData("son", 16)]
    [InlineData("annual", 0)]
    [InlineData(" y2019 ", 2019)]
    public void NamesParseToTheirCodesAndBack(string text, short code)
    {
        AtlasPeriod period = AtlasPeriod.Parse(text);
        Assert.Equal(code, period.Code);
        Assert.Equal(text.Trim().ToLowerInvariant(), period.Name);
        Assert.Equal(period, AtlasPeriod.FromCode(code));
        Assert.True(AtlasPeriod.TryParse(period.Name, out AtlasPeriod again));
        Assert.Equal(period, again);
    }

    [Theory]
    [InlineData("january")]
    [InlineData("y19")]
    [InlineData("y0999")]
    [InlineData("winter")]
    [InlineData("")]
    public void UnknownNamesFailWithAClearMessage(string text)
    {
        Assert.False(AtlasPeriod.TryParse(text, out _));
        var error = Assert.Throws<FormatException>(() => AtlasPeriod.Parse(text));
        Assert.Contains($"'{text}'", error.Message);
        Assert.Contains("djf", error.Message);
        Assert.Throws<ArgumentOutOfRangeException>(() => AtlasPeriod.FromCode(17));
    }

    [Fact]
    public void StandardPeriodsAreTheSeventeenClimatologicalOnes()
    {
        Assert.Equal(17, AtlasPeriod.StandardPeriods.Count);
        Assert.Equal("jan feb mar apr may jun jul aug sep oct nov dec djf mam jja son annual",
            string.Join(' ', AtlasPeriod.StandardPeriods.Select(p => p.Name)));
        Assert.Equal(AtlasPeriod.Annual, default);
    }

    // Seasons by calendar month across all years (CDO yseasmean's grouping, from memory): 31 December 2001 and
    // 1 January 2001 are both DJF; months in UTC, so a local time is converted first.
    [Fact]
    public void SeasonsAndYearsContainCalendarMonthsInUtc()
    {
        Assert.True(AtlasPeriod.Djf.Contains(new DateTime(2001, 12, 31, 23, 0, 0, DateTimeKind.Utc)));
        Assert.True(AtlasPeriod.Djf.Contains(new DateTime(2001, 1, 1, 0, 0, 0, DateTimeKind.Utc)));
        Assert.False(AtlasPeriod.Djf.Contains(new DateTime(2001, 3, 1, 0, 0, 0, DateTimeKind.Utc)));
        Assert.True(AtlasPeriod.Year(2019).Contains(new DateTime(2019, 7, 1, 0, 0, 0, DateTimeKind.Utc)));
        Assert.False(AtlasPeriod.Year(2019).ContainsUnixSeconds(new DateTimeOffset(2020, 1, 1, 0, 0, 0, TimeSpan.Zero).ToUnixTimeSeconds()));
        Assert.True(AtlasPeriod.Month(2).ContainsUnixSeconds(new DateTimeOffset(2004, 2, 29, 23, 59, 59, TimeSpan.Zero).ToUnixTimeSeconds()));
        Assert.Equal(AtlasPeriod.Djf, AtlasPeriod.SeasonOf(12));
        Assert.Equal(AtlasPeriod.Son, AtlasPeriod.SeasonOf(11));
        Assert.True(AtlasPeriod.Annual.Contains(new DateTime(1990, 5, 5)));
    }

    [Fact]
    public void PeriodSerialisesToJsonAsItsName()
    {
        Assert.Equal("\"y2019\"", JsonSerializer.Serialize(AtlasPeriod.Year(2019)));
        Assert.Equal(AtlasPeriod.Jja, JsonSerializer.Deserialize<AtlasPeriod>("\"JJA\""));
        Assert.Throws<JsonException>(() => JsonSerializer.Deserialize<AtlasPeriod>("\"summer\""));
    }
}
