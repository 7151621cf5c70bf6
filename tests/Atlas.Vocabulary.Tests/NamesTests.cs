namespace Atlas.Vocabulary.Tests;

public class NamesTests
{
    // Trade symbols and units of tests/data/README.md (units spelled as UDUNITS / CF conventions: degree, 1).
    [Theory]
    [InlineData(WaveParameter.Hs, "hs", "m")]
    [InlineData(WaveParameter.Te, "te", "s")]
    [InlineData(WaveParameter.Tp, "tp", "s")]
    [InlineData(WaveParameter.J, "j", "kW/m")]
    [InlineData(WaveParameter.Dir, "dir", "degree")]
    [InlineData(WaveParameter.Spread, "spread", "degree")]
    [InlineData(WaveParameter.D, "d", "1")]
    [InlineData(WaveParameter.Depth, "depth", "m")]
    public void ParametersHaveTheirTradeSymbolsAndUnits(WaveParameter parameter, string symbol, string unit)
    {
        Assert.Equal(symbol, parameter.Symbol());
        Assert.Equal(unit, parameter.Unit());
        Assert.Equal(parameter, WaveParameterNames.Parse(symbol.ToUpperInvariant()));
    }

    [Fact]
    public void StatisticNamesRoundTripAndUnknownNamesAreListedInTheError()
    {
        Assert.Equal("mean sd min max p10 p50 p90 p99 count coverage", string.Join(' ', StatisticKindNames.All.Select(k => k.Name())));
        foreach (StatisticKind kind in StatisticKindNames.All) Assert.Equal(kind, StatisticKindNames.Parse(kind.Name()));
        Assert.Contains("p99", Assert.Throws<FormatException>(() => StatisticKindNames.Parse("median")).Message);
        Assert.Contains("spread", Assert.Throws<FormatException>(() => WaveParameterNames.Parse("hm0")).Message);
        Assert.False(WaveParameterNames.TryParse(null, out _));
    }

    [Fact]
    public void GroupsAreSubsetsInTheirStatedOrderAndSeriesIndexFollowsThem()
    {
        // J and D are derived (power from Hm0 and Te, directionality from the spectrum or the spread): never read or stored as series.
        Assert.Equal("hs te tp dir spread depth", string.Join(' ', WaveParameterGroups.HindcastFields.Select(p => p.Symbol())));
        Assert.Equal(WaveParameterGroups.HindcastFields.Where(p => p != WaveParameter.Depth), WaveParameterGroups.SeriesFields);
        Assert.Equal("hs tp te dir", string.Join(' ', WaveParameterGroups.StationFields.Select(p => p.Symbol())));
        for (var k = 0; k < WaveParameterGroups.SeriesFields.Count; k++) Assert.Equal(k, WaveParameterGroups.SeriesIndex(WaveParameterGroups.SeriesFields[k]));
        Assert.Equal(-1, WaveParameterGroups.SeriesIndex(WaveParameter.J));
    }

    [Fact]
    public void JsonCarriesSymbolsAndAWrongOneSaysWhatWasExpected()
    {
        Assert.Equal("\"spread\"", System.Text.Json.JsonSerializer.Serialize(WaveParameter.Spread));
        Assert.Equal(WaveParameter.Tp, System.Text.Json.JsonSerializer.Deserialize<WaveParameter>("\"TP\""));
        var error = Assert.Throws<System.Text.Json.JsonException>(() => System.Text.Json.JsonSerializer.Deserialize<WaveParameter>("\"hm0\""));
        Assert.Contains("wave parameter symbol", error.Message);
        Assert.Throws<ArgumentOutOfRangeException>(() => ((WaveParameter)42).Unit());
    }
}
