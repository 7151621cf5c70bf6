using Atlas.TestSupport;

namespace Atlas.Cli.Tests;

public class CommandLineTests(TestDatabase database) : IClassFixture<TestDatabase>
{
    [Fact]
    public void DatabaseStatusReportsTheServerPostgisAndTheSchema()
    {
        var (code, output) = AtlasProcess.Run("db status", new Dictionary<string, string> { ["ATLAS_DB"] = database.ConnectionString });
        Assert.Equal(0, code);
        Assert.Contains("PostgreSQL 15", output);
        Assert.Contains("PostGIS 3", output);
        Assert.Contains("migration(s) applied", output);
    }

    [Fact]
    public void RunningTheDemoTwiceDuplicatesNothing()
    {
        var home = Directory.CreateTempSubdirectory("atlas-demo-home-").FullName;
        var environment = new Dictionary<string, string> { ["ATLAS_DB"] = database.ConnectionString, ["ATLAS_HOME"] = home };
        var (first, firstOutput) = AtlasProcess.Run("demo --months 2", environment);
        Assert.True(first == 0, firstOutput);
        Assert.Contains("(new dataset)", firstOutput);
        var counts = Counts();
        Assert.True(counts.Chunks > 0 && counts.Statistics > 0, firstOutput);

        var (second, secondOutput) = AtlasProcess.Run("demo --months 2", environment);
        Assert.True(second == 0, secondOutput);
        Assert.Contains("using the files already generated", secondOutput);
        Assert.Contains("nothing new", secondOutput);
        Assert.Contains("up to date", secondOutput);
        Assert.Equal(counts, Counts());
    }

    [Fact]
    public void IngestOfAMissingFileSaysSoAndChangesNothing()
    {
        var (code, output) = AtlasProcess.Run("ingest /nonexistent/hindcast.nc --dataset missing-file",
            new Dictionary<string, string> { ["ATLAS_DB"] = database.ConnectionString });
        Assert.Equal(2, code);
        Assert.Contains("/nonexistent/hindcast.nc: no such file", output);
        Assert.Contains("Nothing was changed", output);
    }

    private (long Datasets, long Chunks, long Statistics, long Files) Counts()
    {
        using var command = database.DataSource.CreateCommand("""
            SELECT (SELECT count(*) FROM dataset), (SELECT count(*) FROM series_chunk),
                   (SELECT count(*) FROM cell_statistic), (SELECT count(*) FROM source_file)
            """);
        using var reader = command.ExecuteReader();
        reader.Read();
        return (reader.GetInt64(0), reader.GetInt64(1), reader.GetInt64(2), reader.GetInt64(3));
    }
}
