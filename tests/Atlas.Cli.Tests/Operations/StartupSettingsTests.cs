using Atlas.TestSupport;

namespace Atlas.Cli.Tests.Operations;

/// <summary>Settings checked when a command starts, each refused with its name and what a good one looks like.</summary>
public sealed class StartupSettingsTests(TestDatabase database) : IClassFixture<TestDatabase>
{
    [Fact]
    public void ServeRefusesAWrongOptionByNameWithoutAStackTrace()
    {
        var (code, output) = AtlasProcess.Run("serve", new Dictionary<string, string>
        {
            ["ATLAS_DB"] = database.ConnectionString,
            ["ASPNETCORE_URLS"] = $"http://127.0.0.1:{RunningAtlas.FreePort()}",
            ["AtlasApiOptions__CorsOrigins__0"] = "maps.example.org/page",
        });
        Assert.Equal(2, code);
        Assert.Contains("atlas serve: not started", output);
        Assert.Contains("CorsOrigins", output);
        Assert.DoesNotContain("   at ", output);
    }

    [Fact]
    public void ServeRefusesAMalformedReadConnectionStringByName()
    {
        var (code, output) = AtlasProcess.Run("serve", new Dictionary<string, string>
        {
            ["ATLAS_DB"] = database.ConnectionString,
            ["ATLAS_DB_READ"] = "Port=5432;Database=atlas",
            ["ASPNETCORE_URLS"] = $"http://127.0.0.1:{RunningAtlas.FreePort()}",
        });
        Assert.Equal(2, code);
        Assert.Contains("ATLAS_DB_READ is not a usable PostgreSQL connection string", output);
    }

    [Fact]
    public void WorkerRefusesAMetricsAddressThatIsNotAnHttpUrl()
    {
        var (code, output) = AtlasProcess.Run("worker --metrics-urls ftp://127.0.0.1:9464", new Dictionary<string, string> { ["ATLAS_DB"] = database.ConnectionString });
        Assert.NotEqual(0, code);
        Assert.Contains("--metrics-urls: 'ftp://127.0.0.1:9464' is not an http URL", output);
    }

    [Fact]
    public void ValidateReadsTheDistanceLimitFromConfigurationAndRefusesAWrongOneByName()
    {
        // The same key as the API's (AtlasApiOptions:PointMaxDistanceKm): atlas validate no longer ignores configuration.
        var (code, output) = AtlasProcess.Run("validate some-dataset", new Dictionary<string, string>
        {
            ["ATLAS_DB"] = database.ConnectionString,
            ["AtlasApiOptions__PointMaxDistanceKm"] = "-5",
        });
        Assert.Equal(2, code);
        Assert.Contains("atlas validate: not started", output);
        Assert.Contains("PointMaxDistanceKm", output);
        Assert.DoesNotContain("   at ", output);
    }

    [Fact]
    public void ValidateReadsItsOwnSectionBeforeTheApiKeys()
    {
        // StationValidation:PointMaxDistanceKm overrides the API's key, which stays the fallback.
        var (code, output) = AtlasProcess.Run("validate some-dataset", new Dictionary<string, string>
        {
            ["ATLAS_DB"] = database.ConnectionString,
            ["AtlasApiOptions__PointMaxDistanceKm"] = "5",
            ["StationValidation__PointMaxDistanceKm"] = "-5",
        });
        Assert.Equal(2, code);
        Assert.Contains("atlas validate: not started", output);
        Assert.Contains("PointMaxDistanceKm", output);
        Assert.DoesNotContain("   at ", output);
    }

    [Theory]
    [InlineData("stats some-dataset", "atlas stats: not started")]
    [InlineData("ingest --dataset some-dataset no-such-file.nc", "atlas ingest: not started")]
    [InlineData("worker", "atlas worker: not started")]
    public void ACommandRefusesAWrongStatisticsSettingByNameBeforeItStarts(string command, string refusal)
    {
        // 0.07 m bins do not divide the 30 m upper bound into whole bins.
        var (code, output) = AtlasProcess.Run(command, new Dictionary<string, string>
        {
            ["ATLAS_DB"] = database.ConnectionString,
            ["Statistics__HsBinning__BinWidth"] = "0.07",
        });
        Assert.Equal(2, code);
        Assert.Contains(refusal, output);
        Assert.Contains("Statistics:HsBinning", output);
        Assert.DoesNotContain("   at ", output);
    }

    [Fact]
    public void AnEmbeddedClusterPortThatIsNotANumberIsNamed()
    {
        var (code, output) = AtlasProcess.Run("db status", new Dictionary<string, string> { ["ATLAS_DB"] = "", ["ATLAS_PG_PORT"] = "54x39" });
        Assert.NotEqual(0, code);
        Assert.Contains("ATLAS_PG_PORT is '54x39'", output);
    }
}
