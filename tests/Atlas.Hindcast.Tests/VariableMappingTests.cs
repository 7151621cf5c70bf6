namespace Atlas.Hindcast.Tests;

public sealed class VariableMappingTests
{
    [Fact]
    public void EveryKeyIsRead()
    {
        var m = VariableMapping.Parse("""
            { "hs": "a", "te": "b", "tp": "c", "dir_to": "d", "spread": "e", "depth": "f",
              "depth_positive": "down", "time": "t", "units": { "hs": "cm", "dir_to": "radians" } }
            """);
        Assert.Equal("a", m.Names[WaveParameter.Hs]);
        Assert.Equal("d", m.Names[WaveParameter.Dir]);
        Assert.True(m.DirectionIsTowards);
        Assert.False(m.DepthPositiveUp);
        Assert.Equal("t", m.TimeVariable);
        Assert.Equal("cm", m.Units[WaveParameter.Hs]);
        Assert.Equal("radians", m.Units[WaveParameter.Dir]);
    }

    [Theory]
    [InlineData("""{ "hz": "a" }""", "hz", "unknown key")]
    [InlineData("""{ "dir": "a", "dir_to": "b" }""", "dir_to", "gives the direction twice")]
    [InlineData("""{ "depth_positive": "sideways" }""", "depth_positive", "must be \"up\" or \"down\"")]
    [InlineData("""{ "hs": 3 }""", "hs", "must be a non-empty string")]
    [InlineData("""{ "units": { "swh": "m" } }""", "units.swh", "unknown key")]
    public void BadEntriesNameTheMappingFileAndKey(string json, string key, string problem)
    {
        var e = Assert.Throws<HindcastFormatException>(() => VariableMapping.Parse(json, "site.json"));
        Assert.Equal("site.json", e.File);
        Assert.Equal(key, e.Variable);
        Assert.Contains(problem, e.Problem);
    }

    [Fact]
    public void InvalidJsonIsRefusedNamingTheFile()
    {
        var e = Assert.Throws<HindcastFormatException>(() => VariableMapping.Parse("{ \"hs\": ", "site.json"));
        Assert.StartsWith("site.json: not valid JSON", e.Message);
    }
}
