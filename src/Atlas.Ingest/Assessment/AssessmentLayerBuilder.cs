using System.Security.Cryptography;
using System.Text.Json;
using Atlas.Assessment;
using Atlas.Assessment.Access;
using Atlas.Assessment.Yield;
using Atlas.Storage.Datasets;
using Atlas.Storage.Devices;
using Atlas.Storage.Queries;
using Atlas.Storage.Series;
using Atlas.WavePhysics;
using Npgsql;

namespace Atlas.Ingest.Assessment;

/// <summary>A named column of per-cell values.</summary>
public sealed record LayerColumn(string Name, string Unit, double[] Values);

/// <summary>
/// A whole-dataset assessment layer: one value per wet cell (NaN where the cell has no valid step), the primary column
/// first, and what produced it.
/// </summary>
public sealed record AssessmentLayer(string Kind, string Title, string Description, int[] CellIds, IReadOnlyList<LayerColumn> Columns, DateTime ComputedAtUtc)
{
    public LayerColumn Primary => Columns[0];
}

/// <summary>
/// Computes the device-yield and accessibility layers over every wet cell of a dataset, on request: the needed variables
/// are streamed once (<see cref="CellVariableStream"/>), each cell's series is put on the dataset's regular steps and
/// analysed by the same library calls as a point request, so a layer value equals the point value at that cell. Results are
/// kept in the layer cache under the statistics stamp (a recomputation clears them).
/// </summary>
public sealed class AssessmentLayerBuilder(NpgsqlDataSource dataSource, LayerCacheStore? cache = null)
{
    // The API passes its cache store, which writes through the writer connection while dataSource may be read-only.
    private readonly LayerCacheStore _cache = cache ?? new(dataSource);

    /// <summary>Annual energy (MWh/yr) per cell for a device, with capacity factor, share outside the matrix and mean power.</summary>
    public Task<AssessmentLayer> YieldAsync(DatasetRecord dataset, StoredDeviceMatrix device, PowerMatrixInterpolation interpolation, CancellationToken cancel)
    {
        var matrix = DeviceMatrices.ToPowerMatrix(device);
        var reading = interpolation == PowerMatrixInterpolation.Bilinear ? "bilinear" : "nearest";
        var key = $"assessment/yield/{device.Slug}-{device.Id}-{device.CreatedAtUtc.Ticks:x}/{reading}";
        return CachedAsync(dataset, key, async () =>
        {
            var stored = await StoredVariablesAsync(dataset, cancel);
            var wanted = device.AxisKind == DeviceAxisKind.Te ? WaveParameter.Te : WaveParameter.Tp;
            var other = wanted == WaveParameter.Te ? WaveParameter.Tp : WaveParameter.Te;
            WaveParameter[] variables = stored.Contains(wanted) || !stored.Contains(other) ? [WaveParameter.Hs, wanted] : [WaveParameter.Hs, other];
            var (ids, rows) = await ComputeAsync(dataset, variables, 4, (hs, te, tp, output) =>
            {
                var period = device.AxisKind == DeviceAxisKind.Te ? te ?? Convert(tp, p => PeriodConversion.EnergyPeriodFromPeakPeriod(p))
                                                                  : tp ?? Convert(te, p => PeriodConversion.PeakPeriodFromEnergyPeriod(p));
                if (period is null) { Array.Fill(output, double.NaN); return; }
                var y = DeviceYield.FromSeries(matrix, hs, period, matrix.PeriodKind, new YieldOptions { Interpolation = interpolation });
                output[0] = y.AnnualEnergyMwh;
                output[1] = y.CapacityFactor;
                output[2] = y.OutsideMatrixFraction;
                output[3] = y.MeanPowerKw;
            }, cancel);
            return new AssessmentLayer("yield", $"Mean annual energy of {device.Name}",
                $"annual energy production of device {device.Name} ({DeviceStore.AxisName(device.AxisKind)} matrix, rated {device.RatedPowerKw:0.###} kW, " +
                $"{reading} interpolation), power per step then averaged, x 8766 h; " + DeviceYield.MethodNote,
                ids, [new("annual_energy_mwh", "MWh/yr", rows[0]), new("capacity_factor", "1", rows[1]),
                      new("outside_matrix_fraction", "1", rows[2]), new("mean_power_kw", "kW", rows[3])], DateTime.UtcNow);
        }, cancel);
    }

    /// <summary>
    /// The share of time within access limits per cell; with <paramref name="requiredHours"/>, also the probability that a
    /// window of that length starts at a random time (all months together), which then becomes the primary value.
    /// </summary>
    public Task<AssessmentLayer> AccessibilityAsync(DatasetRecord dataset, AccessLimits limits, double? requiredHours, CancellationToken cancel)
    {
        var key = FormattableString.Invariant($"assessment/accessibility/hs{limits.HsLimitMetres:R}-tp{limits.TpLimitSeconds:R}-h{requiredHours:R}");
        return CachedAsync(dataset, key, async () =>
        {
            var variables = limits.TpLimitSeconds is null ? new[] { WaveParameter.Hs } : [WaveParameter.Hs, WaveParameter.Tp];
            var (ids, rows) = await ComputeAsync(dataset, variables, requiredHours is null ? 1 : 2, (hs, _, tp, output) =>
            {
                if (limits.TpLimitSeconds is not null && tp is null) { Array.Fill(output, double.NaN); return; }
                var fraction = Accessibility.Of(hs.Values, tp is null ? default : tp.Values, limits).Fraction;
                if (requiredHours is not { } hours) { output[0] = fraction; return; }
                var windows = WeatherWindowAnalysis.Analyse(hs, tp, limits, hours);
                int starts = windows.Months.Sum(m => m.WindowStartSteps), determined = windows.Months.Sum(m => m.DeterminedSteps);
                output[0] = determined > 0 ? (double)starts / determined : double.NaN;
                output[1] = fraction;
            }, cancel);
            var limitText = FormattableString.Invariant($"Hs <= {limits.HsLimitMetres:0.###} m{(limits.TpLimitSeconds is { } t ? $" and Tp <= {t:0.###} s" : "")}");
            IReadOnlyList<LayerColumn> columns = requiredHours is { } h
                ? [new("window_start_probability", "1", rows[0]), new("accessible_fraction", "1", rows[1])]
                : [new("accessible_fraction", "1", rows[0])];
            return new AssessmentLayer("accessibility",
                requiredHours is { } r ? FormattableString.Invariant($"Probability of a {r:0.##} h window with {limitText}") : $"Share of time with {limitText}",
                (requiredHours is { } d
                    ? FormattableString.Invariant($"probability that a window of at least {d:0.##} h with {limitText} starts at a random time (all months); ")
                    : "") + $"accessible_fraction: share of non-missing steps with {limitText}. " + WeatherWindowAnalysis.MethodNote,
                ids, columns, DateTime.UtcNow);
        }, cancel);
    }

    /// <summary>
    /// Why a dataset's time line cannot carry a layer (fewer than two steps, or no common step), or null when it can.
    /// </summary>
    public static string? TimelineProblem(IReadOnlyDictionary<int, long[]> timelines)
    {
        var times = timelines.Values.SelectMany(t => t).ToArray();
        if (times.Length < 2) return "it stores no series yet (fewer than two time steps); ingest its files first";
        try
        {
            RegularSeries.FromTimes(times, new double[times.Length]);
            return null;
        }
        catch (ArgumentException e)
        {
            return "its time line is not on a common step: " + e.Message.Split(" (Parameter")[0];
        }
    }

    private delegate void CellAnalysis(RegularSeries hs, RegularSeries? te, RegularSeries? tp, double[] output);

    /// <summary>Runs <paramref name="analyse"/> on every wet cell with its Hs, Te and Tp (null where not stored).</summary>
    private async Task<(int[] CellIds, double[][] Rows)> ComputeAsync(DatasetRecord dataset, WaveParameter[] variables, int columns, CellAnalysis analyse,
        CancellationToken cancel)
    {
        var timelines = await new DatasetStore(dataSource).TimelinesAsync(dataset.Id, cancel);
        var times = timelines.Values.SelectMany(t => t).ToArray();
        var offsets = new Dictionary<int, (int Offset, int Count)>();
        var offset = 0;
        foreach (var (year, line) in timelines) { offsets[year] = (offset, line.Length); offset += line.Length; }
        // Where each stored step falls on the regular step (FromTimes checks the time line once for all cells).
        var template = RegularSeries.FromTimes(times, [.. Enumerable.Range(0, times.Length).Select(i => (double)i)]);
        var place = new int[times.Length];
        for (var k = 0; k < template.Count; k++) if (!double.IsNaN(template.Values[k])) place[(int)template.Values[k]] = k;

        var wet = (await new Storage.Cells.CellStore(dataSource).AllAsync(dataset.Id, cancel)).Where(c => c.Wet).Select(c => c.CellId).ToHashSet();
        var ids = new List<int>();
        var rows = Enumerable.Range(0, columns).Select(_ => new List<double>()).ToArray();
        var decoded = variables.Select(_ => new float[times.Length]).ToArray();
        var present = new bool[variables.Length];
        var pending = new List<(int CellId, RegularSeries Hs, RegularSeries? Te, RegularSeries? Tp)>(CellsPerBatch);
        var current = -1;

        RegularSeries? Series(WaveParameter v)
        {
            var k = Array.IndexOf(variables, v);
            if (k < 0 || !present[k]) return null;
            var regular = new double[template.Count];
            Array.Fill(regular, double.NaN);
            for (var i = 0; i < times.Length; i++) regular[place[i]] = decoded[k][i];
            return new RegularSeries(template.StartUnixSeconds, template.StepSeconds, regular);
        }

        // The analyses are independent per cell: a batch is shared out over the cores while the next one is read.
        void Analyse()
        {
            var outputs = new double[pending.Count][];
            Parallel.For(0, pending.Count, new ParallelOptions { CancellationToken = cancel }, i =>
            {
                outputs[i] = new double[columns];
                analyse(pending[i].Hs, pending[i].Te, pending[i].Tp, outputs[i]);
            });
            for (var i = 0; i < pending.Count; i++)
            {
                ids.Add(pending[i].CellId);
                for (var c = 0; c < columns; c++) rows[c].Add(outputs[i][c]);
            }
            pending.Clear();
        }

        void Finish()
        {
            if (current < 0 || !wet.Contains(current) || Series(WaveParameter.Hs) is not { } hs) return;
            pending.Add((current, hs, Series(WaveParameter.Te), Series(WaveParameter.Tp)));
            if (pending.Count == CellsPerBatch) Analyse();
        }

        await foreach (var chunk in new CellVariableStream(dataSource).StreamAsync(dataset.Id, variables, cancel))
        {
            if (chunk.CellId != current)
            {
                Finish();
                current = chunk.CellId;
                foreach (var values in decoded) values.AsSpan().Fill(float.NaN);
                Array.Clear(present);
            }
            if (!offsets.TryGetValue(chunk.Year, out var at)) continue;
            for (var k = 0; k < variables.Length; k++)
                if (chunk.Payloads[k] is { } payload && SeriesCodec.StepCountOf(payload) == at.Count)
                    present[k] |= SeriesCodec.Decode(payload, variables[k], decoded[k].AsSpan(at.Offset, at.Count));
        }
        Finish();
        Analyse();
        return ([.. ids], [.. rows.Select(r => r.ToArray())]);
    }

    private const int CellsPerBatch = 256;

    /// <summary>The variables the dataset's chunks hold, judged by the first stored chunk (an ingest writes the same variables for every cell).</summary>
    public async Task<HashSet<WaveParameter>> StoredVariablesAsync(DatasetRecord dataset, CancellationToken cancel)
    {
        var chunks = await new SeriesStore(dataSource).ReadCellAsync(dataset.Id, await FirstWetCellAsync(dataset, cancel), cancel: cancel);
        return chunks.Count == 0 ? [] : [.. WaveParameterGroups.SeriesFields.Where(v => SeriesCodec.Has(chunks[0].Payload, v))];
    }

    private async Task<int> FirstWetCellAsync(DatasetRecord dataset, CancellationToken cancel)
    {
        await using var connection = await dataSource.OpenConnectionAsync(cancel);
        var wet = await Storage.Cells.CellStore.WetCellIdsAsync(connection, null, dataset.Id, cancel);
        return wet.Length > 0 ? wet[0] : -1;
    }

    private static RegularSeries? Convert(RegularSeries? source, Func<double, double> convert)
    {
        if (source is null) return null;
        var values = new double[source.Count];
        for (var i = 0; i < values.Length; i++) values[i] = double.IsNaN(source.Values[i]) ? double.NaN : convert(source.Values[i]);
        return new RegularSeries(source.StartUnixSeconds, source.StepSeconds, values);
    }

    private async Task<AssessmentLayer> CachedAsync(DatasetRecord dataset, string key, Func<Task<AssessmentLayer>> compute, CancellationToken cancel)
    {
        var stamp = await new DatasetGeometryQueries(dataSource).StatisticsStampAsync(dataset.Id, cancel);
        var fullKey = $"{key}@{stamp.Token}";
        if (await _cache.FindAsync(dataset.Id, fullKey, cancel) is { } cached)
            return JsonSerializer.Deserialize<AssessmentLayer>(cached.Content, CacheJson)!;
        var layer = await compute();
        var content = JsonSerializer.SerializeToUtf8Bytes(layer, CacheJson);
        await _cache.PutAsync(dataset.Id, fullKey, new CachedLayer("\"" + System.Convert.ToHexStringLower(SHA256.HashData(content))[..32] + "\"", "application/json", content), cancel);
        return layer;
    }

    /// <summary>NaN survives the cache as a named literal.</summary>
    private static readonly JsonSerializerOptions CacheJson = new() { NumberHandling = System.Text.Json.Serialization.JsonNumberHandling.AllowNamedFloatingPointLiterals };
}
