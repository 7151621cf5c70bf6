using Atlas.Storage.Statistics;
using Atlas.TestSupport;
using Npgsql;

namespace Atlas.Storage.Tests;

/// <summary>Statistic rows written in PostgreSQL's binary COPY format come back as PostgreSQL reads them.</summary>
public class StatisticsCopyTests(TestDatabase database) : IClassFixture<TestDatabase>
{
    [Fact]
    public async Task StatisticRowsRoundTripThroughTheBinaryCopyFormat()
    {
        StatisticRow[] rows =
        [
            new(7, 0, 0, 1.25f, 0.5f, 0.01f, 9.75f, 0.4f, 1.1f, 2.3f, 4.8f, 8760, 0.998f, [0.5f, 0.25f, 0.125f, 0f, 0f]),
            new(7, 13, 3, 12.5f, null, float.NaN, float.PositiveInfinity, null, null, null, null, 0, 0f, null),
            new(8, 2019, 4, 271.5f, 18.25f, null, null, null, null, null, null, 100, 1f, [.. Enumerable.Range(0, 16).Select(k => k / 120f)]),
        ];
        // Enough rows to fill the encoder's buffer several times over.
        var many = Enumerable.Range(1000, 5000).Select(c => rows[0] with { CellId = c }).ToArray();
        await new StatisticsStore(database.DataSource).ReplaceAsync(1, [7, 8, .. many.Select(r => r.CellId)], [.. rows, .. many], DateTime.UtcNow);

        var store = new StatisticsStore(database.DataSource);
        var seven = await store.ForCellAsync(1, 7);
        Assert.Equal(rows[0], seven[0] with { Extra = rows[0].Extra });
        Assert.Equal(rows[0].Extra, seven[0].Extra);
        // Not-finite optional values are stored as NULL.
        Assert.Equal(rows[1] with { Min = null, Max = null }, seven[1]);
        var eight = Assert.Single(await store.ForCellAsync(1, 8));
        Assert.Equal(rows[2].Extra, eight.Extra);
        Assert.Equal(271.5f, eight.Mean);

        // PostgreSQL's own reading of the array: one dimension, lower bound 1, float4 elements.
        await using var command = database.DataSource.CreateCommand(
            "SELECT array_lower(extra, 1), array_upper(extra, 1), pg_typeof(extra)::text, count(*) OVER () FROM cell_statistic WHERE cell_id = 8");
        await using var reader = await command.ExecuteReaderAsync();
        Assert.True(await reader.ReadAsync());
        Assert.Equal((1, 16, "real[]"), (reader.GetInt32(0), reader.GetInt32(1), reader.GetString(2)));
        Assert.Equal(5003, await Count("SELECT count(*) FROM cell_statistic WHERE dataset_id = 1"));
    }

    private async Task<long> Count(string sql)
    {
        await using var command = database.DataSource.CreateCommand(sql);
        return (long)(await command.ExecuteScalarAsync())!;
    }
}
