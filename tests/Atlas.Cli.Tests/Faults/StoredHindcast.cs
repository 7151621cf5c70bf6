using Atlas.Storage.Series;
using Npgsql;

namespace Atlas.Cli.Tests.Faults;

/// <summary>Checks that a dataset holds one fixture file exactly: every step once, every wet cell, the file's values.</summary>
public static class StoredHindcast
{
    public static async Task AssertHoldsExactlyAsync(NpgsqlDataSource dataSource, string slug, int steps, int nx, int ny)
    {
        var dataset = await new Storage.Datasets.DatasetStore(dataSource).FindAsync(slug);
        Assert.NotNull(dataset);
        var epoch = new DateTimeOffset(2020, 1, 1, 0, 0, 0, TimeSpan.Zero).ToUnixTimeSeconds();
        var timeline = (await new Storage.Datasets.DatasetStore(dataSource).TimelinesAsync(dataset!.Id)).SelectMany(y => y.Value).ToArray();
        // The file's time axis, from make_fixture.py: hours 0, 3, 6, ... since 2020-01-01; no step missing, none twice.
        Assert.Equal(Enumerable.Range(0, steps).Select(s => epoch + (long)(s * HindcastFixture.StepHours * 3600)), timeline);
        Assert.Equal(1L, await CountAsync(dataSource, "SELECT count(*) FROM source_file WHERE dataset_id = $1", dataset.Id));
        // Point (0, 0) is land in the fixture; every other cell has one chunk per year.
        Assert.Equal((long)(nx * ny - 1), await CountAsync(dataSource, "SELECT count(*) FROM series_chunk WHERE dataset_id = $1", dataset.Id));
        var series = new SeriesStore(dataSource);
        foreach (var (j, i) in new[] { (0, 1), (ny - 1, nx - 1), (ny / 2, nx / 3) })
        {
            var chunk = Assert.Single(await series.ReadCellAsync(dataset.Id, j * nx + i));
            Assert.Equal(steps, SeriesCodec.StepCountOf(chunk.Payload));
            var hs = new float[steps];
            SeriesCodec.Decode(chunk.Payload, WaveParameter.Hs, hs);
            for (var s = 0; s < steps; s++)
            {
                // Tolerance: float32 storage in the file and the series codec's 0.5 mm quantisation (as in the ingest tests).
                var expected = HindcastFixture.Hs(s * HindcastFixture.StepHours, j, i);
                Assert.True(Math.Abs(hs[s] - expected) <= 0.0006, $"cell ({j},{i}) step {s}: stored {hs[s]}, file {expected}");
            }
        }
    }

    public static async Task<long> CountAsync(NpgsqlDataSource dataSource, string sql, params object[] parameters)
    {
        await using var command = dataSource.CreateCommand(sql);
        foreach (var p in parameters) command.Parameters.AddWithValue(p);
        return Convert.ToInt64(await command.ExecuteScalarAsync());
    }

    /// <summary>The backend of a COPY running in <paramref name="database"/>, or null.</summary>
    public static async Task<int?> CopyBackendAsync(NpgsqlDataSource dataSource, string database)
    {
        await using var command = dataSource.CreateCommand(
            "SELECT pid FROM pg_stat_activity WHERE datname = $1 AND state = 'active' AND query ILIKE 'COPY %' LIMIT 1");
        command.Parameters.AddWithValue(database);
        return await command.ExecuteScalarAsync() is int pid ? pid : null;
    }
}
