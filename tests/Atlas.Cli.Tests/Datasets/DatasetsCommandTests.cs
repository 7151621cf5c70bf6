using System.Globalization;
using Atlas.Storage.Datasets;
using Atlas.Storage.Jobs;
using Npgsql;

namespace Atlas.Cli.Tests.Datasets;

/// <summary>
/// <c>atlas datasets list|show|remove</c> run as a user runs them. The numbers they print are checked against counts
/// the test takes itself with SQL over the tables, and the stored sizes against PostgreSQL's own octet_length.
/// </summary>
public class DatasetsCommandTests(TwoDatasets data) : IClassFixture<TwoDatasets>
{
    private static readonly CultureInfo Invariant = CultureInfo.InvariantCulture;

    /// <summary>Every table with rows of one dataset, keyed by its id (the job table by its slug).</summary>
    private static readonly string[] DatasetTables =
        ["series_chunk", "cell_statistic_state", "mesh_triangle", "cell", "statistic_block", "dataset_year", "source_file", "layer_cache"];

    [Fact]
    public void ListShowsOneLinePerDatasetWithItsCellsYearsAndStatisticsState()
    {
        var (code, output) = AtlasProcess.Run("datasets list", data.Environment);
        Assert.True(code == 0, output);
        var lines = output.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        var demo = Assert.Single(lines, l => l.StartsWith(TwoDatasets.Demo + " "));
        var second = Assert.Single(lines, l => l.StartsWith(TwoDatasets.Second + " "));
        foreach (var (line, slug) in new[] { (demo, TwoDatasets.Demo), (second, TwoDatasets.Second) })
        {
            var (points, wet) = (Scalar($"SELECT count(*) FROM cell WHERE dataset_id = {Id(slug)}"), Scalar($"SELECT count(*) FROM cell WHERE dataset_id = {Id(slug)} AND wet"));
            Assert.Contains($"regular  {points.ToString("N0", Invariant)} cells ({wet.ToString("N0", Invariant)} wet)", line);
            Assert.Contains("years 2021", line);
        }
        Assert.EndsWith("statistics: complete", demo.TrimEnd());
        Assert.EndsWith("statistics: none", second.TrimEnd());
    }

    [Fact]
    public async Task ShowReportsTheCountsSizesAssumptionsStatisticsAndJobsStored()
    {
        var (code, output) = AtlasProcess.Run($"datasets show {TwoDatasets.Demo}", data.Environment);
        Assert.True(code == 0, output);
        var id = Id(TwoDatasets.Demo);
        string N(long value) => value.ToString("N0", Invariant);

        var points = Scalar($"SELECT count(*) FROM cell WHERE dataset_id = {id}");
        var wet = Scalar($"SELECT count(*) FROM cell WHERE dataset_id = {id} AND wet");
        Assert.Contains($"cells       {N(points)} points, {N(wet)} wet", output);
        var steps = Scalar($"SELECT sum(cardinality(times)) FROM dataset_year WHERE dataset_id = {id}");
        Assert.Contains($"years       2021 ({N(steps)} time steps", output);
        // The demo writes a step every three hours (10,800 s), January and February 2021.
        Assert.Contains("typically 10,800 s apart, 2021-01-01 00:00 UTC to 2021-02-28 21:00 UTC", output);

        var chunks = Scalar($"SELECT count(*) FROM series_chunk WHERE dataset_id = {id}");
        var blocks = Scalar($"SELECT count(*) FROM statistic_block WHERE dataset_id = {id}");
        Assert.Contains($"series       {N(chunks)} chunks, ", output);
        Assert.Contains($"statistics   {N(blocks)} blocks, ", output);
        // PostgreSQL documentation (Storage, TOAST): a stored value is its bytes plus a varlena header of at most
        // 4 bytes, so the sum of pg_column_size lies between the payloads' octet_length and that plus 4 per row.
        var storage = await new DatasetStore(data.Database.DataSource).StorageAsync(id);
        var payloadBytes = Scalar($"SELECT sum(octet_length(payload)) FROM series_chunk WHERE dataset_id = {id}");
        Assert.InRange(storage.SeriesBytes, payloadBytes, payloadBytes + 4 * chunks);
        Assert.Contains($"({N(storage.SeriesBytes)} bytes)", output);
        Assert.Contains($"({N(storage.StatisticBytes)} bytes)", output);

        var metadata = (string)(await Command($"SELECT metadata::text FROM dataset WHERE dataset_id = {id}").ExecuteScalarAsync())!;
        using var document = System.Text.Json.JsonDocument.Parse(metadata);
        var assumptions = VariableAssumption.ListFrom(document.RootElement);
        Assert.NotEmpty(assumptions);
        foreach (var assumption in assumptions) Assert.Contains("    " + assumption.Describe() + "\n", output);

        var computed = Scalar($"SELECT count(*) FROM cell_statistic_state WHERE dataset_id = {id}");
        Assert.Equal(wet, computed);
        Assert.Contains($"{N(computed)} of {N(wet)} wet cells computed", output);
        Assert.Contains($"method version {Atlas.Statistics.MethodNotes.Version} ", output);
        Assert.Contains("options: Hs thresholds ", output);
        // Options in words, never a code identifier such as the spectrum's enum member.
        Assert.Contains("Te from Tp where Te is absent: JONSWAP spectrum with peak enhancement 3.3", output);
        Assert.DoesNotMatch(@"\b[A-Z][a-z]+[A-Z][A-Za-z]*\d*\b", output.Split('\n').Single(l => l.Contains("options: Hs thresholds ", StringComparison.Ordinal)));
        foreach (var job in await new JobQueue(data.Database.DataSource).ForDatasetAsync(TwoDatasets.Demo))
            Assert.Contains($"job {job.Id}  {JobQueue.KindName(job.Kind)}  done", output);
    }

    [Fact]
    public void RemoveWithYesDeletesEveryRowOfTheDatasetAndLeavesTheOthersUntouched()
    {
        const string slug = "removed-with-yes";
        data.Load(slug);
        var id = Id(slug);
        Assert.True(Rows(id, slug) > 0);
        var others = (Rows(Id(TwoDatasets.Demo), TwoDatasets.Demo), Rows(Id(TwoDatasets.Second), TwoDatasets.Second));
        Assert.True(Scalar($"SELECT count(*) FROM statistic_block WHERE dataset_id = {id}") > 0, "the dataset to remove has statistics");

        var (code, output) = AtlasProcess.Run($"datasets remove {slug} --yes", data.Environment, standardInput: "");
        Assert.True(code == 0, output);
        Assert.Contains($"dataset {slug}: removed with ", output);
        Assert.Equal(0, Scalar($"SELECT count(*) FROM dataset WHERE slug = '{slug}'"));
        Assert.Equal(0, Rows(id, slug));
        Assert.Equal(others, (Rows(Id(TwoDatasets.Demo), TwoDatasets.Demo), Rows(Id(TwoDatasets.Second), TwoDatasets.Second)));
    }

    [Fact]
    public void RemoveWithoutYesOnInputThatIsNoTerminalIsRefusedAndChangesNothing()
    {
        var before = Rows(Id(TwoDatasets.Second), TwoDatasets.Second);
        var (code, output) = AtlasProcess.Run($"datasets remove {TwoDatasets.Second}", data.Environment, standardInput: $"{TwoDatasets.Second}\n");
        Assert.Equal(2, code);
        Assert.Contains("the input is not a terminal", output);
        Assert.Contains("--yes", output);
        Assert.Equal(before, Rows(Id(TwoDatasets.Second), TwoDatasets.Second));
    }

    [Fact]
    public void RemoveOnATerminalAsksForTheSlugAndKeepsTheDatasetOnAnyOtherAnswer()
    {
        const string slug = "asked-on-a-terminal";
        data.Load(slug, "--no-stats");
        var id = Id(slug);
        var before = Rows(id, slug);

        var (kept, keptOutput) = AtlasProcess.RunOnTerminal($"datasets remove {slug}", "yes", data.Environment);
        Assert.True(kept == 1, keptOutput);
        Assert.Contains("Type its slug to remove it", keptOutput);
        Assert.Contains($"'{slug}' was kept.", keptOutput);
        Assert.Equal(before, Rows(id, slug));

        var (removed, removedOutput) = AtlasProcess.RunOnTerminal($"datasets remove {slug}", slug, data.Environment);
        Assert.True(removed == 0, removedOutput);
        Assert.Contains($"dataset {slug}: removed with ", removedOutput);
        Assert.Equal(0, Rows(id, slug));
    }

    [Fact]
    public async Task RemoveIsRefusedWhileAJobOfTheDatasetIsRunning()
    {
        var queue = new JobQueue(data.Database.DataSource);
        var job = await queue.EnqueueAsync(JobKind.Statistics, TwoDatasets.Second, "{}");
        Assert.NotNull(await queue.ClaimAsync(job, "test-worker"));
        try
        {
            var before = Rows(Id(TwoDatasets.Second), TwoDatasets.Second);
            var (code, output) = AtlasProcess.Run($"datasets remove {TwoDatasets.Second} --yes", data.Environment, standardInput: "");
            Assert.Equal(2, code);
            Assert.Contains($"'{TwoDatasets.Second}' was not removed: job {job} of it is running", output);
            Assert.Equal(before, Rows(Id(TwoDatasets.Second), TwoDatasets.Second));
            Assert.Equal("running", (await queue.FindAsync(job))!.State);
        }
        finally
        {
            await queue.FailAsync(job, "ended by the test");
        }
    }

    [Fact]
    public async Task RemoveIsRefusedWhileAnIngestHoldsTheDatasetsLock()
    {
        var before = Rows(Id(TwoDatasets.Second), TwoDatasets.Second);
        await using var connection = await data.Database.DataSource.OpenConnectionAsync();
        await using var transaction = await connection.BeginTransactionAsync();
        await DatasetStore.LockForIngestAsync(connection, transaction, TwoDatasets.Second, CancellationToken.None);

        var (code, output) = AtlasProcess.Run($"datasets remove {TwoDatasets.Second} --yes", data.Environment, standardInput: "");
        Assert.Equal(2, code);
        Assert.Contains($"'{TwoDatasets.Second}' was not removed: an ingest of it is in progress", output);
        await transaction.RollbackAsync();
        Assert.Equal(before, Rows(Id(TwoDatasets.Second), TwoDatasets.Second));
    }

    [Theory]
    [InlineData("show")]
    [InlineData("remove --yes")]
    public void AnUnknownSlugIsNamedWithExitCodeTwo(string verb)
    {
        var (code, output) = AtlasProcess.Run($"datasets {verb.Split(' ')[0]} no-such-dataset {string.Join(' ', verb.Split(' ').Skip(1))}",
            data.Environment, standardInput: "");
        Assert.Equal(2, code);
        Assert.Contains("there is no dataset 'no-such-dataset' (atlas datasets list)", output);
    }

    private int Id(string slug) => (int)Scalar($"SELECT coalesce(max(dataset_id), -1) FROM dataset WHERE slug = '{slug}'");

    /// <summary>The rows of every table keyed by the dataset, and its jobs.</summary>
    private long Rows(int id, string slug) =>
        DatasetTables.Sum(table => Scalar($"SELECT count(*) FROM {table} WHERE dataset_id = {id}"))
        + Scalar($"SELECT count(*) FROM job WHERE dataset_slug = '{slug}'");

    private long Scalar(string sql)
    {
        using var command = Command(sql);
        return Convert.ToInt64(command.ExecuteScalar(), Invariant);
    }

    private NpgsqlCommand Command(string sql) => data.Database.DataSource.CreateCommand(sql);
}
