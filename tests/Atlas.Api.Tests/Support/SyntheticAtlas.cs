using System.Globalization;
using System.Security.Cryptography;
using System.Text;
using System.Text.Json;
using Atlas.Storage.Cells;
using Atlas.Storage.Datasets;
using Atlas.Storage.Series;
using Atlas.Storage.Statistics;
using Npgsql;
using Atlas.TestSupport;

namespace Atlas.Api.Tests.Support;

/// <summary>
/// An invented test atlas, written through the stores: a regular 12 x 10 grid ("test-coast", 0.1 degree, land in the
/// two eastern columns) with two years of 3-hourly series, and an 81 x 81 node triangle mesh ("test-mesh") whose hs
/// mean is a linear function of position. Statistics rows of the grid come from NumPy
/// (Reference/synthetic_statistics.py) computed on the decoded series.
/// </summary>
public static class SyntheticAtlas
{
    public const string CoastSlug = "test-coast";
    public const string MeshSlug = "test-mesh";
    /// <summary>The same grid and series as <see cref="CoastSlug"/>, with its statistics computed by the statistics service.</summary>
    public const string ServiceSlug = "test-coast-service";
    public const int Nx = 12, Ny = 10, FirstDryColumn = 10;
    public const double West = 20.0, South = 40.0, Step = 0.1;
    public static readonly int[] Years = [2019, 2020];
    public const int StepSeconds = 3 * 3600;
    public const int MeshSide = 81;
    public const double MeshWest = 30.0, MeshSouth = 10.0, MeshStep = 0.01;
    public const string SourceFileName = "test-coast-hindcast.nc";
    // Recorded as a file loaded before checksums were BLAKE3 would be (the migration's prefix), so that the older form shows too.
    public static readonly string SourceChecksum = "sha256:" + Convert.ToHexStringLower(SHA256.HashData("invented test hindcast"u8));

    public static double Longitude(int i) => West + Step * i;
    public static double Latitude(int j) => South + Step * j;
    public static int CellId(int i, int j) => j * Nx + i;

    /// <summary>Depth of a wet grid column, m; cell (0, 0) has no depth (deep water).</summary>
    public static float? Depth(int i, int j) => i == 0 && j == 0 ? null : 10f + 15f * (FirstDryColumn - i);

    /// <summary>The hs mean the mesh layer holds at a position: 0.5 + 2 (lon - 30) + 3 (lat - 10), m.</summary>
    public static double MeshHs(double lon, double lat) => 0.5 + 2 * (lon - MeshWest) + 3 * (lat - MeshSouth);

    /// <summary>Times of a year's steps, Unix seconds.</summary>
    public static long[] Timeline(int year)
    {
        var start = new DateTimeOffset(year, 1, 1, 0, 0, 0, TimeSpan.Zero).ToUnixTimeSeconds();
        var end = new DateTimeOffset(year + 1, 1, 1, 0, 0, 0, TimeSpan.Zero).ToUnixTimeSeconds();
        return Enumerable.Range(0, (int)((end - start) / StepSeconds)).Select(k => start + (long)k * StepSeconds).ToArray();
    }

    public static async Task SeedAsync(NpgsqlDataSource dataSource, string workFolder)
    {
        var wet = await SeedCoastAsync(dataSource, CoastSlug);
        var rows = await ReferenceRowsAsync(wet, workFolder);
        await new StatisticsStore(dataSource).ReplaceAsync(await IdOfAsync(dataSource, CoastSlug), wet.Select(c => c.CellId).ToArray(), rows, DateTime.UtcNow);
        await SeedCoastAsync(dataSource, ServiceSlug);
        await new Atlas.Ingest.Statistics.StatisticsService(dataSource).RunAsync(ServiceSlug, all: true);
        await SeedMeshAsync(dataSource);
    }

    private static async Task<int> IdOfAsync(NpgsqlDataSource dataSource, string slug) => (await new DatasetStore(dataSource).FindAsync(slug))!.Id;

    internal static async Task<List<CellRecord>> SeedCoastAsync(NpgsqlDataSource dataSource, string slug)
    {
        var grid = JsonSerializer.Serialize(new
        {
            kind = "regular", point_count = Nx * Ny, nx = Nx, ny = Ny, fingerprint = "synthetic",
            longitudes = Enumerable.Range(0, Nx).Select(i => Math.Round(Longitude(i), 8)),
            latitudes = Enumerable.Range(0, Ny).Select(j => Math.Round(Latitude(j), 8)),
        });
        var metadata = JsonSerializer.Serialize(new Dictionary<string, object>
        {
            ["variables"] = new Dictionary<string, object> { ["hs"] = new { units = "m" }, ["te"] = new { units = "s" }, ["tp"] = new { units = "s" }, ["dir"] = new { units = "degree" }, ["spread"] = new { units = "degree" }, ["depth"] = new { units = "m" } },
            ["licence"] = "Invented test data, free to use",
            ["citation"] = "Synthetic coast hindcast for the API tests",
            ["depth_note"] = "finite-depth power from the cell depth",
            ["validation"] = new { stations = 1, hs_scatter_index = 0.14 },
        });
        int datasetId;
        var wet = new List<CellRecord>();
        await using (var connection = await dataSource.OpenConnectionAsync())
        await using (var transaction = await connection.BeginTransactionAsync())
        {
            datasetId = await DatasetStore.InsertAsync(connection, transaction, slug, "Synthetic coast", "regular", Nx, Ny, Nx * Ny, grid, metadata, CancellationToken.None);
            var cells = new List<CellRecord>();
            for (var j = 0; j < Ny; j++)
            for (var i = 0; i < Nx; i++)
            {
                var isWet = i < FirstDryColumn;
                var cell = new CellRecord(CellId(i, j), i, j, Longitude(i), Latitude(j), isWet ? Depth(i, j) : null, isWet);
                cells.Add(cell);
                if (isWet) wet.Add(cell);
            }
            await CellStore.InsertAsync(connection, datasetId, cells, CancellationToken.None);
            foreach (var year in Years) await DatasetStore.UpsertTimelineAsync(connection, transaction, datasetId, year, Timeline(year), CancellationToken.None);
            var first = Timeline(Years[0])[0];
            var last = Timeline(Years[^1])[^1];
            await DatasetStore.InsertSourceFileAsync(connection, transaction, datasetId, new SourceFileRecord(SourceFileName, SourceChecksum, 123456,
                DateTimeOffset.FromUnixTimeSeconds(first).UtcDateTime, DateTimeOffset.FromUnixTimeSeconds(last).UtcDateTime,
                Years.Sum(y => Timeline(y).Length), null, DateTime.UtcNow), CancellationToken.None);
            await transaction.CommitAsync();
        }
        await using (var connection = await dataSource.OpenConnectionAsync())
        {
            await SeriesStore.WriteAsync(connection, datasetId, wet.SelectMany(c => Years.Select(y => new SeriesChunk(c.CellId, y, Chunk(c, y)))), CancellationToken.None);
            await using var transaction = await connection.BeginTransactionAsync();
            await DatasetStore.UpdateExtentAsync(connection, transaction, datasetId, CancellationToken.None);
            await CellStore.UpdateCoastDistanceAsync(connection, transaction, datasetId, CancellationToken.None);
            await transaction.CommitAsync();
        }
        return wet;
    }

    /// <summary>One cell-year of invented series: a seasonal swell with noise; column 3 misses every 50th step.</summary>
    public static byte[] Chunk(CellRecord cell, int year)
    {
        var times = Timeline(year);
        var random = new Random(cell.CellId * 7919 + year);
        var n = times.Length;
        float[] hs = new float[n], te = new float[n], tp = new float[n], dir = new float[n], spread = new float[n];
        for (var k = 0; k < n; k++)
        {
            var phase = 2 * Math.PI * (times[k] % (365.25 * 86400)) / (365.25 * 86400);
            hs[k] = (float)Math.Max(0.2, 1.6 + 0.9 * Math.Cos(phase) + 0.04 * cell.GridI!.Value + 0.3 * Normal(random));
            te[k] = (float)Math.Max(3, 7 + 1.5 * Math.Cos(phase) + 0.5 * Normal(random));
            tp[k] = (float)(te[k] / 0.9 + 0.2 * Math.Abs(Normal(random)));
            dir[k] = (float)(((260 + 25 * Math.Sin(phase) + 10 * Normal(random)) % 360 + 360) % 360);
            spread[k] = (float)(25 + 5 * Math.Abs(Normal(random)));
            if (cell.GridI == 3 && k % 50 == 0) { hs[k] = float.NaN; te[k] = float.NaN; }
        }
        return SeriesCodec.Encode(n, hs, te, tp, dir, spread);
    }

    private static double Normal(Random random) =>
        Math.Sqrt(-2 * Math.Log(1 - random.NextDouble())) * Math.Cos(2 * Math.PI * random.NextDouble());

    /// <summary>Writes the decoded series for NumPy, runs the reference script and reads its rows back.</summary>
    private static async Task<List<StatisticRow>> ReferenceRowsAsync(IReadOnlyList<CellRecord> wet, string workFolder)
    {
        var input = Path.Combine(workFolder, "series.bin");
        var output = Path.Combine(workFolder, "statistics.csv");
        var times = Years.SelectMany(Timeline).ToArray();
        await using (var file = new BinaryWriter(File.Create(input)))
        {
            file.Write(wet.Count);
            file.Write(times.Length);
            foreach (var t in times) file.Write(t);
            foreach (var cell in wet)
            {
                file.Write(cell.CellId);
                file.Write(cell.DepthMetres is { } d ? d : double.NaN);
                var decoded = new float[5][];
                for (var v = 0; v < 5; v++) decoded[v] = new float[times.Length];
                var offset = 0;
                foreach (var year in Years)
                {
                    var chunk = Chunk(cell, year);
                    var n = SeriesCodec.StepCountOf(chunk);
                    for (var v = 0; v < 5; v++) SeriesCodec.Decode(chunk, WaveParameterGroups.SeriesFields[v], decoded[v].AsSpan(offset, n));
                    offset += n;
                }
                foreach (var series in decoded) foreach (var x in series) file.Write(x);
            }
        }
        ExternalTool.Run(ExternalTool.Python, Path.Combine(AppContext.BaseDirectory, "Reference", "synthetic_statistics.py"), input, output);
        var rows = new List<StatisticRow>();
        foreach (var line in await File.ReadAllLinesAsync(output))
        {
            var f = line.Split(',');
            float? F(int i) => f[i].Length == 0 ? null : float.Parse(f[i], CultureInfo.InvariantCulture);
            rows.Add(new StatisticRow(int.Parse(f[0], CultureInfo.InvariantCulture), AtlasPeriod.FromCode(short.Parse(f[1], CultureInfo.InvariantCulture)),
                (WaveParameter)short.Parse(f[2], CultureInfo.InvariantCulture), F(3), F(4), F(5), F(6), F(7), F(8), F(9), F(10),
                int.Parse(f[11], CultureInfo.InvariantCulture), float.Parse(f[12], CultureInfo.InvariantCulture),
                f[13].Length == 0 ? null : f[13].Split(';').Select(x => float.Parse(x, CultureInfo.InvariantCulture)).ToArray()));
        }
        return rows;
    }

    private static async Task SeedMeshAsync(NpgsqlDataSource dataSource)
    {
        int datasetId;
        var nodes = new List<CellRecord>();
        for (var j = 0; j < MeshSide; j++)
        for (var i = 0; i < MeshSide; i++)
            nodes.Add(new CellRecord(j * MeshSide + i, null, null, MeshWest + MeshStep * i, MeshSouth + MeshStep * j, 50f, true));
        var triangles = new List<(int, int, int)>();
        for (var j = 0; j + 1 < MeshSide; j++)
        for (var i = 0; i + 1 < MeshSide; i++)
        {
            int a = j * MeshSide + i, b = a + 1, c = a + MeshSide + 1, d = a + MeshSide;
            triangles.Add((a, b, c));
            triangles.Add((a, c, d));
        }
        await using (var connection = await dataSource.OpenConnectionAsync())
        await using (var transaction = await connection.BeginTransactionAsync())
        {
            datasetId = await DatasetStore.InsertAsync(connection, transaction, MeshSlug, "Synthetic mesh", "mesh", null, null, nodes.Count,
                """{"kind":"mesh","mesh":"test_mesh"}""", """{"licence":"Invented test data"}""", CancellationToken.None);
            await CellStore.InsertAsync(connection, datasetId, nodes, CancellationToken.None);
            await CellStore.InsertTrianglesAsync(connection, datasetId, triangles, CancellationToken.None);
            await DatasetStore.UpdateExtentAsync(connection, transaction, datasetId, CancellationToken.None);
            await transaction.CommitAsync();
        }
        var rows = nodes.Select(n => new StatisticRow(n.CellId, AtlasPeriod.Annual, WaveParameter.Hs, (float)MeshHs(n.Longitude, n.Latitude), null, null, null, null, null, null, null, 100, 1f, null)).ToList();
        await new StatisticsStore(dataSource).ReplaceAsync(datasetId, nodes.Select(n => n.CellId).ToArray(), rows, DateTime.UtcNow);
    }
}
