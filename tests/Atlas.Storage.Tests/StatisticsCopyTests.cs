using Atlas.Storage.Statistics;
using Atlas.TestSupport;
using Npgsql;

namespace Atlas.Storage.Tests;

/// <summary>
/// Statistic rows packed into blocks and written in PostgreSQL's binary COPY format come back as PostgreSQL reads them,
/// through the store and through the one-row-per-cell view.
/// </summary>
public class StatisticsCopyTests(TestDatabase database) : IClassFixture<TestDatabase>
{
    [Fact]
    public async Task StatisticRowsRoundTripThroughTheBinaryCopyFormat()
    {
        StatisticRow[] rows =
        [
            new(7, AtlasPeriod.Annual, WaveParameter.Hs, 1.25f, 0.5f, 0.01f, 9.75f, 0.4f, 1.1f, 2.3f, 4.8f, 8760, 0.998f, [0.5f, 0.25f, 0.125f, 0f, 0f]),
            new(7, AtlasPeriod.Djf, WaveParameter.J, 12.5f, null, float.NaN, float.PositiveInfinity, null, null, null, null, 0, 0f, null),
            new(8, AtlasPeriod.Year(2019), WaveParameter.Dir, 271.5f, 18.25f, null, null, null, null, null, null, 100, 1f, [.. Enumerable.Range(0, 16).Select(k => k / 120f)]),
        ];
        // Enough rows to fill the encoder's buffer several times over.
        var many = Enumerable.Range(1000, 5000).Select(c => rows[0] with { CellId = c }).ToArray();
        await new StatisticsStore(database.DataSource).ReplaceAsync(1, [7, 8, .. many.Select(r => r.CellId)], [.. rows, .. many], DateTime.UtcNow);

        var store = new StatisticsStore(database.DataSource);
        var seven = await store.ForCellAsync(1, 7);
        Assert.Equal(rows[0], seven[0] with { Fractions = rows[0].Fractions });
        Assert.Equal(rows[0].Fractions, seven[0].Fractions);
        // Not-finite optional values come back as null.
        Assert.Equal(rows[1] with { Min = null, Max = null }, seven[1]);
        var eight = Assert.Single(await store.ForCellAsync(1, 8));
        Assert.Equal(rows[2].Fractions, eight.Fractions);
        Assert.Equal(271.5f, eight.Mean);

        // PostgreSQL's own reading of the arrays through the view: one dimension, lower bound 1, float4 elements.
        await using var command = database.DataSource.CreateCommand(
            "SELECT array_lower(extra, 1), array_upper(extra, 1), pg_typeof(extra)::text, mean, min FROM cell_statistic WHERE cell_id = 8");
        await using (var reader = await command.ExecuteReaderAsync())
        {
            Assert.True(await reader.ReadAsync());
            Assert.Equal((1, 16, "real[]", 271.5f), (reader.GetInt32(0), reader.GetInt32(1), reader.GetString(2), reader.GetFloat(3)));
            Assert.True(reader.IsDBNull(4), "an absent value reads as NULL through the view");
        }
        Assert.Equal(5003, await Count("SELECT count(*) FROM cell_statistic WHERE dataset_id = 1"));
        Assert.Equal(0.125f, await Scalar<float>("SELECT extra[3] FROM cell_statistic WHERE dataset_id = 1 AND cell_id = 4321 AND parameter = 0"));
        // 5,000 cells from 1000 to 5999 fall in blocks 0..5 (1,024 cells a block): parameter 0 annual has 6 rows.
        Assert.Equal(6, await Count("SELECT count(*) FROM statistic_block WHERE dataset_id = 1 AND parameter = 0 AND period = 0"));
    }

    [Fact]
    public async Task ReplacingSomeCellsOfABlockKeepsTheOthers()
    {
        var store = new StatisticsStore(database.DataSource);
        StatisticRow Row(int cell, float mean) => new(cell, AtlasPeriod.Annual, WaveParameter.Hs, mean, 0.1f, 0f, 2f * mean, null, mean, null, null, 100, 1f, [0.5f, 0.25f]);
        await store.ReplaceAsync(2, [10, 11, 12, 2000], [Row(10, 1f), Row(11, 2f), Row(12, 3f), Row(2000, 4f)], DateTime.UtcNow);
        // Cell 11 gets a new value, cell 12 loses its statistics (replaced with no rows), 10 and 2000 stay as they were.
        await store.ReplaceAsync(2, [11, 12], [Row(11, 7f)], DateTime.UtcNow);

        Assert.Equal(Row(10, 1f) with { Fractions = null }, (await store.ForCellAsync(2, 10)).Single() with { Fractions = null });
        Assert.Equal(7f, (await store.ForCellAsync(2, 11)).Single().Mean);
        Assert.Empty(await store.ForCellAsync(2, 12));
        var kept = (await store.ForCellAsync(2, 2000)).Single().Fractions;
        Assert.Equal(new[] { 0.5f, 0.25f }, kept);
        var layer = await store.LayerAsync(2, WaveParameter.Hs, AtlasPeriod.Annual, StatisticKind.Mean, id => new Cells.CellRecord(id, 0, 0, 0, 0, null, true, null));
        Assert.Equal([(10, 1.0), (11, 7.0), (2000, 4.0)], layer.Select(v => (v.CellId, v.Value)));
        var exceedance = await store.LayerAsync(2, WaveParameter.Hs, AtlasPeriod.Annual, StatisticKind.Mean, id => new Cells.CellRecord(id, 0, 0, 0, 0, null, true, null), fractionIndex: 2);
        Assert.All(exceedance, v => Assert.Equal(0.25, v.Value));
        // Values of the absent percentile (P10) are left out of its layer.
        Assert.Empty(await store.LayerAsync(2, WaveParameter.Hs, AtlasPeriod.Annual, StatisticKind.P10, id => new Cells.CellRecord(id, 0, 0, 0, 0, null, true, null)));
    }

    private Task<long> Count(string sql) => Scalar<long>(sql);

    private async Task<T> Scalar<T>(string sql)
    {
        await using var command = database.DataSource.CreateCommand(sql);
        return (T)(await command.ExecuteScalarAsync())!;
    }
}
