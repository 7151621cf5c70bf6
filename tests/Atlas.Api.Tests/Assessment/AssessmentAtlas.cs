using System.Globalization;
using System.Net.Http.Headers;
using System.Text;
using System.Text.Json;
using Atlas.Api.Tests.Support;
using Atlas.Assessment;
using Atlas.Storage;
using Atlas.Storage.Cells;
using Atlas.Storage.Datasets;
using Atlas.Storage.Series;
using Npgsql;

namespace Atlas.Api.Tests.Assessment;

/// <summary>
/// What the assessment tests add to the shared synthetic atlas (<see cref="SyntheticAtlas"/>), once per fixture:
/// "assess-long", a 3 x 3 grid with seven years of 3-hourly invented series (long enough for annual maxima), and
/// "assess-scaled", a 3 x 3 grid over cells (4..6, 3..5) of test-coast whose Hs is that of test-coast times 0.8 (a
/// second, worse hindcast run of the same place). Stations are built from the stored series of test-coast itself.
/// </summary>
public static class AssessmentAtlas
{
    public const string LongSlug = "assess-long";
    public const string ScaledSlug = "assess-scaled";
    public static readonly int[] LongYears = [2014, 2015, 2016, 2017, 2018, 2019, 2020];
    public const double LongWest = 40.0, LongSouth = 5.0, LongStep = 0.05;
    public const double HsScale = 0.8;

    private static readonly SemaphoreSlim Gate = new(1, 1);
    private static readonly HashSet<string> Seeded = [];

    public static string Checkout { get; } = AtlasHome.FindCheckout(AppContext.BaseDirectory)!;

    public static async Task EnsureSeededAsync(AtlasApiFixture atlas)
    {
        await Gate.WaitAsync();
        try
        {
            if (!Seeded.Add(atlas.ConnectionString)) return;
            await SeedLongAsync(atlas.DataSource);
            await SeedScaledAsync(atlas.DataSource);
        }
        finally
        {
            Gate.Release();
        }
    }

    public static HttpClient Writer(AtlasApiFixture atlas)
    {
        var client = atlas.Factory.CreateClient();
        client.DefaultRequestHeaders.Add("X-Api-Key", AtlasApiFixture.ApiKey);
        return client;
    }

    public static string At(double latitude, double longitude) => string.Create(CultureInfo.InvariantCulture, $"lat={latitude}&lon={longitude}");

    /// <summary>A test-coast cell's stored series, decoded as the API decodes it (both years).</summary>
    public static (long[] Times, float[] Hs, float[] Te, float[] Tp, float[] Dir) CoastSeries(int i, int j)
    {
        var cell = new CellRecord(SyntheticAtlas.CellId(i, j), i, j, SyntheticAtlas.Longitude(i), SyntheticAtlas.Latitude(j), SyntheticAtlas.Depth(i, j), true);
        var times = SyntheticAtlas.Years.SelectMany(SyntheticAtlas.Timeline).ToArray();
        var (hs, te, tp, dir) = Decode(SyntheticAtlas.Years.Select(y => SyntheticAtlas.Chunk(cell, y)), times.Length);
        return (times, hs, te, tp, dir);
    }

    /// <summary>A station's record as CSV: the stored Hs of a test-coast cell, linearly interpolated to the observation
    /// times (an independent re-implementation of the matching), plus <paramref name="offset"/> and Gaussian noise.</summary>
    public static (string Csv, List<(long Time, double Observed, double Modelled, bool Flagged)> Rows) OffsetRecord(
        int i, int j, double offset, double noise, int seed, IReadOnlySet<int> flaggedRows)
    {
        var (times, hs, _, _, _) = CoastSeries(i, j);
        var random = new Random(seed);
        var rows = new List<(long, double, double, bool)>();
        var text = new StringBuilder("# invented station built from test-coast for the validation tests\ntime,hs_m,qc\n");
        var start = DateTimeOffset.Parse("2019-02-01T00:00:00Z", CultureInfo.InvariantCulture).ToUnixTimeSeconds();
        var end = DateTimeOffset.Parse("2019-05-01T00:00:00Z", CultureInfo.InvariantCulture).ToUnixTimeSeconds();
        var gapStart = DateTimeOffset.Parse("2019-03-10T00:00:00Z", CultureInfo.InvariantCulture).ToUnixTimeSeconds();
        var gapEnd = DateTimeOffset.Parse("2019-03-12T00:00:00Z", CultureInfo.InvariantCulture).ToUnixTimeSeconds();
        var index = 0;
        // Every 50 minutes: irregular against the 3-hourly model, with a two-day gap in the record.
        for (var t = start; t < end; t += 50 * 60)
        {
            if (t >= gapStart && t < gapEnd) continue;
            var k = Array.BinarySearch(times, t);
            double modelled;
            if (k >= 0) modelled = hs[k];
            else
            {
                var after = ~k;
                var w = (double)(t - times[after - 1]) / (times[after] - times[after - 1]);
                modelled = hs[after - 1] + w * (hs[after] - hs[after - 1]);
            }
            var flagged = flaggedRows.Contains(index++);
            // Where the model misses a step the station still measured: any plausible value will do, it is never paired.
            var observed = Math.Round((double.IsNaN(modelled) ? 1.5 : modelled) + offset + noise * Normal(random), 3);
            rows.Add((t, observed, modelled, flagged));
            text.Append(DateTimeOffset.FromUnixTimeSeconds(t).UtcDateTime.ToString("yyyy-MM-dd'T'HH:mm:ss'Z'", CultureInfo.InvariantCulture))
                .Append(',').Append(observed.ToString("0.###", CultureInfo.InvariantCulture)).Append(',').Append(flagged ? "1" : "0").Append('\n');
        }
        return (text.ToString(), rows);
    }

    /// <summary>Posts a CSV record as multipart/form-data with its description; returns the response.</summary>
    public static Task<HttpResponseMessage> PostStationAsync(HttpClient client, string name, double lat, double lon, string role, string csv, string fileName = "record.csv")
    {
        var form = new MultipartFormDataContent
        {
            { new StringContent(name), "name" },
            { new StringContent(lat.ToString("R", CultureInfo.InvariantCulture)), "lat" },
            { new StringContent(lon.ToString("R", CultureInfo.InvariantCulture)), "lon" },
            { new StringContent("25"), "depth_m" },
            { new StringContent("invented test buoy"), "instrument" },
            { new StringContent(role), "role" },
        };
        var file = new ByteArrayContent(Encoding.UTF8.GetBytes(csv));
        file.Headers.ContentType = new MediaTypeHeaderValue("text/csv");
        form.Add(file, "file", fileName);
        return client.PostAsync("/api/v1/stations", form);
    }

    public static async Task<JsonElement> JsonAsync(HttpResponseMessage response)
    {
        var body = await response.Content.ReadAsStringAsync();
        Assert.True(response.IsSuccessStatusCode, $"{(int)response.StatusCode}: {body}");
        return JsonDocument.Parse(body).RootElement.Clone();
    }

    public static RegularSeries Regular(long[] times, float[] values) =>
        RegularSeries.FromTimes(times, [.. values.Select(v => (double)v)]);

    /// <summary>The seven-year series of an assess-long cell, decoded.</summary>
    public static (long[] Times, float[] Hs) LongSeries(int i, int j)
    {
        var times = LongYears.SelectMany(SyntheticAtlas.Timeline).ToArray();
        var decoded = Decode(LongYears.Select(y => LongChunk(j * 3 + i, y)), times.Length);
        return (times, decoded.Hs);
    }

    private static (float[] Hs, float[] Te, float[] Tp, float[] Dir) Decode(IEnumerable<byte[]> chunks, int total)
    {
        float[] hs = new float[total], te = new float[total], tp = new float[total], dir = new float[total];
        var offset = 0;
        foreach (var chunk in chunks)
        {
            var n = SeriesCodec.StepCountOf(chunk);
            SeriesCodec.Decode(chunk, WaveParameter.Hs, hs.AsSpan(offset, n));
            SeriesCodec.Decode(chunk, WaveParameter.Te, te.AsSpan(offset, n));
            SeriesCodec.Decode(chunk, WaveParameter.Tp, tp.AsSpan(offset, n));
            SeriesCodec.Decode(chunk, WaveParameter.Dir, dir.AsSpan(offset, n));
            offset += n;
        }
        return (hs, te, tp, dir);
    }

    /// <summary>Invented seven-year series: a seasonal swell, noise, and a winter storm of random height each month.</summary>
    private static byte[] LongChunk(int cellId, int year)
    {
        var times = SyntheticAtlas.Timeline(year);
        var random = new Random(cellId * 104729 + year);
        var n = times.Length;
        float[] hs = new float[n], te = new float[n], tp = new float[n];
        var stormHeight = 0.0;
        for (var k = 0; k < n; k++)
        {
            var phase = 2 * Math.PI * (times[k] % (365.25 * 86400)) / (365.25 * 86400);
            if (k % 240 == 0) stormHeight = (1 + Math.Cos(phase)) * -Math.Log(1 - random.NextDouble());
            var storm = stormHeight * Math.Exp(-Math.Pow((k % 240 - 120) / 12.0, 2));
            hs[k] = (float)Math.Max(0.2, 1.4 + 0.7 * Math.Cos(phase) + 0.2 * Normal(random) + storm + 0.02 * cellId);
            te[k] = (float)Math.Max(3, 7 + 1.2 * Math.Cos(phase) + 0.4 * Normal(random) + 0.6 * storm);
            tp[k] = te[k] / 0.9f;
        }
        return SeriesCodec.Encode(n, hs, te, tp, default, default);
    }

    private static async Task SeedLongAsync(NpgsqlDataSource dataSource)
    {
        var cells = Enumerable.Range(0, 9).Select(id => new CellRecord(id, id % 3, id / 3, LongWest + LongStep * (id % 3), LongSouth + LongStep * (id / 3), 40f, true)).ToList();
        await SeedAsync(dataSource, LongSlug, "Seven-year synthetic cell block", cells, LongStep, LongWest, LongSouth, LongYears,
            (cell, year) => LongChunk(cell.CellId, year));
    }

    private static async Task SeedScaledAsync(NpgsqlDataSource dataSource)
    {
        var cells = new List<CellRecord>();
        for (var j = 0; j < 3; j++)
            for (var i = 0; i < 3; i++)
                cells.Add(new CellRecord(j * 3 + i, i, j, SyntheticAtlas.Longitude(4 + i), SyntheticAtlas.Latitude(3 + j), SyntheticAtlas.Depth(4 + i, 3 + j), true));
        await SeedAsync(dataSource, ScaledSlug, "Synthetic coast, Hs 20 % low", cells, SyntheticAtlas.Step, SyntheticAtlas.Longitude(4), SyntheticAtlas.Latitude(3),
            SyntheticAtlas.Years, (cell, year) =>
            {
                var source = new CellRecord(SyntheticAtlas.CellId(4 + cell.GridI!.Value, 3 + cell.GridJ!.Value), 4 + cell.GridI, 3 + cell.GridJ, 0, 0, null, true);
                var chunk = SyntheticAtlas.Chunk(source, year);
                var n = SeriesCodec.StepCountOf(chunk);
                var v = Enumerable.Range(0, 5).Select(_ => new float[n]).ToArray();
                for (var k = 0; k < 5; k++) SeriesCodec.Decode(chunk, WaveParameterGroups.SeriesFields[k], v[k]);
                for (var k = 0; k < n; k++) v[0][k] *= (float)HsScale;
                return SeriesCodec.Encode(n, v[0], v[1], v[2], v[3], v[4]);
            });
    }

    private static async Task SeedAsync(NpgsqlDataSource dataSource, string slug, string title, List<CellRecord> cells, double step, double west, double south,
        int[] years, Func<CellRecord, int, byte[]> chunk)
    {
        var grid = JsonSerializer.Serialize(new
        {
            kind = "regular", point_count = cells.Count, nx = 3, ny = 3,
            longitudes = Enumerable.Range(0, 3).Select(i => Math.Round(west + step * i, 8)),
            latitudes = Enumerable.Range(0, 3).Select(j => Math.Round(south + step * j, 8)),
        });
        await using var connection = await dataSource.OpenConnectionAsync();
        int id;
        await using (var transaction = await connection.BeginTransactionAsync())
        {
            id = await DatasetStore.InsertAsync(connection, transaction, slug, title, "regular", 3, 3, cells.Count, grid, """{"licence":"Invented test data"}""", CancellationToken.None);
            await CellStore.InsertAsync(connection, id, cells, CancellationToken.None);
            foreach (var year in years) await DatasetStore.UpsertTimelineAsync(connection, transaction, id, year, SyntheticAtlas.Timeline(year), CancellationToken.None);
            await transaction.CommitAsync();
        }
        await SeriesStore.WriteAsync(connection, id, cells.SelectMany(c => years.Select(y => new SeriesChunk(c.CellId, y, chunk(c, y)))), CancellationToken.None);
        await using (var transaction = await connection.BeginTransactionAsync())
        {
            await DatasetStore.UpdateExtentAsync(connection, transaction, id, CancellationToken.None);
            await transaction.CommitAsync();
        }
    }

    private static double Normal(Random random) =>
        Math.Sqrt(-2 * Math.Log(1 - random.NextDouble())) * Math.Cos(2 * Math.PI * random.NextDouble());
}
