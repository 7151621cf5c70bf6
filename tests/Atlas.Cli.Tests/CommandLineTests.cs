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

    [Fact]
    public void ACommandWhoseDatabaseCannotBeUsedSaysWhichWhyAndWhatToSetWithoutATrace()
    {
        var missing = new Npgsql.NpgsqlConnectionStringBuilder(database.ConnectionString) { Database = "no_such_atlas_database" };
        var (code, output) = AtlasProcess.Run("datasets list", new Dictionary<string, string> { ["ATLAS_DB"] = missing.ConnectionString });
        Assert.Equal(3, code);
        // PostgreSQL's own words and code (SQLSTATE 3D000, invalid_catalog_name; PostgreSQL manual, appendix A).
        Assert.Contains("atlas datasets list: cannot use the database 'no_such_atlas_database'", output);
        Assert.Contains("does not exist (SQLSTATE 3D000)", output);
        Assert.Contains("ATLAS_DB", output);
        Assert.DoesNotContain("   at ", output);

        var closed = new Npgsql.NpgsqlConnectionStringBuilder(database.ConnectionString) { Port = 1 };
        (code, output) = AtlasProcess.Run("ingest /nonexistent/hindcast.nc --dataset unreachable", new Dictionary<string, string> { ["ATLAS_DB"] = closed.ConnectionString });
        Assert.Equal(3, code);
        Assert.Contains("atlas ingest: cannot use the database", output);
        Assert.Contains(":1", output);
        Assert.DoesNotContain("   at ", output);
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
