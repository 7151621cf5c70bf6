using System.Buffers;
using System.Buffers.Binary;
using System.Diagnostics;
using Atlas.Hindcast;
using Atlas.Ingest.Progress;
using Atlas.Storage.Cells;
using Atlas.Storage.Datasets;
using Atlas.Storage.Series;
using Npgsql;

namespace Atlas.Ingest.Ingestion;

/// <summary>
/// Loads hindcast files into a dataset: transposes time-major fields into cell-major yearly chunks, packs them
/// (<see cref="SeriesCodec"/>) and writes them with binary COPY. Everything happens in one transaction, so a failed
/// or killed ingest leaves nothing visible and the same command can simply be run again. A file already loaded
/// (same SHA-256) is skipped. A time step given twice (already stored, or in two of the files, as monthly files that
/// share their boundary step) is stored once when its values are identical, and refused naming the step, the variable
/// and the largest difference when they are not, unless the request replaces stored steps.
/// Memory stays within the request's budget: cells are processed in blocks, each read with hyperslab reads.
/// </summary>
public sealed class HindcastIngestor(NpgsqlDataSource dataSource)
{
    private static readonly (WaveParameter Source, WaveParameter Target)[] Stored =
    [
        (WaveParameter.Hs, WaveParameter.Hs), (WaveParameter.Te, WaveParameter.Te), (WaveParameter.Tp, WaveParameter.Tp),
        (WaveParameter.Dir, WaveParameter.Dir), (WaveParameter.Spread, WaveParameter.Spread),
    ];

    /// <summary>Time steps read per hyperslab (bounded further by the float buffer size).</summary>
    private const int MaxSlabBytes = 64 << 20;

    public async Task<IngestSummary> RunAsync(IngestRequest request, IProgress<ProgressSnapshot>? progress = null, CancellationToken cancel = default)
    {
        var clock = Stopwatch.StartNew();
        if (request.Files.Count == 0) throw new IngestException("No files were given to ingest.");
        var files = new List<SourceFile>();
        try
        {
            foreach (var path in request.Files.Distinct())
            {
                cancel.ThrowIfCancellationRequested();
                var opened = SourceFile.Open(path, request.Mapping);
                opened.Release();
                files.Add(opened);
                progress?.Report(new ProgressSnapshot("opening files", files.Count, request.Files.Count, 0, clock.Elapsed, "files"));
            }
            return await LoadAsync(request, files, progress, clock, cancel);
        }
        finally
        {
            foreach (var file in files) file.Dispose();
        }
    }

    private async Task<IngestSummary> LoadAsync(IngestRequest request, List<SourceFile> files, IProgress<ProgressSnapshot>? progress,
        Stopwatch clock, CancellationToken cancel)
    {
        files.Sort((a, b) => a.Times[0].CompareTo(b.Times[0]));
        CheckSameGrid(files);
        await using var connection = await dataSource.OpenConnectionAsync(cancel);
        await using var transaction = await connection.BeginTransactionAsync(cancel);
        await DatasetStore.LockForIngestAsync(connection, transaction, request.DatasetSlug, cancel);

        var dataset = await DatasetStore.FindAsync(connection, transaction, request.DatasetSlug, cancel);
        var loaded = dataset is null ? [] : await DatasetStore.LoadedChecksumsAsync(connection, transaction, dataset.Id, cancel);
        var seen = new HashSet<string>(loaded, StringComparer.OrdinalIgnoreCase);
        var fresh = files.Where(f => seen.Add(f.Sha256)).ToList();
        var skipped = files.Count - fresh.Count;
        if (fresh.Count == 0)
            return new IngestSummary(request.DatasetSlug, 0, skipped, 0, 0, 0, 0, clock.Elapsed, false);

        var grid = GridDescription.Of(fresh[0].Grid);
        if (dataset is not null && !GridDescription.Matches(dataset, grid))
            throw new IngestException($"{fresh[0].Name}: its grid ({grid.Describe()}) differs from the grid of dataset '{dataset.Slug}' " +
                $"({dataset.GridKind}, {dataset.PointCount} points); files of one dataset must share one grid.");

        var stored = dataset is null ? new SortedDictionary<int, long[]>() : await DatasetStore.TimelinesAsync(connection, transaction, dataset.Id, cancel);

        var created = dataset is null;
        var datasetId = dataset?.Id ?? await DatasetStore.InsertAsync(connection, transaction, request.DatasetSlug,
            request.Title ?? fresh[0].Attribute("title") ?? request.DatasetSlug, grid.Kind, grid.Nx, grid.Ny, grid.PointCount,
            grid.ToJson(), "{}", cancel);

        var depths = CellDepths.Read(fresh);
        var candidate = new bool[grid.PointCount];
        for (var p = 0; p < candidate.Length; p++) candidate[p] = depths is null || depths.StoredDepth(p) is not null;
        var existingWet = created ? null : await CellStore.WetCellIdsAsync(connection, transaction, datasetId, cancel);
        var hasData = new bool[grid.PointCount];

        var mask = 0;
        foreach (var file in fresh) mask |= MaskOf(file);
        var storedMask = created ? 0 : MaskFromMetadata(dataset!.MetadataJson);
        mask |= storedMask;

        var years = fresh.SelectMany(f => f.Times.Select(YearTimeline.YearOf)).Distinct().Order().ToArray();
        var stepsPerYear = years.ToDictionary(y => y, y => YearTimeline.Merge(stored.GetValueOrDefault(y, []), fresh.SelectMany(f => f.Times).Where(t => YearTimeline.YearOf(t) == y)));
        var variableCount = System.Numerics.BitOperations.PopCount((uint)mask);
        var freshSteps = fresh.Sum(f => f.Times.Length);
        long totalWork = (long)freshSteps * grid.PointCount, doneWork = 0, bytesRead = 0;
        var cellYears = 0;
        var sharedSteps = 0;
        var conflicts = new SharedStepConflicts();
        var storedName = $"dataset '{request.DatasetSlug}' (already stored)";

        // The COPY of one block runs while the next block is read and transposed (the connection serves one command at
        // a time, so it is awaited before any other use of it). Two blocks are then in memory at once: each gets half
        // the budget.
        var pendingWrite = Task.CompletedTask;
        try
        {
            foreach (var year in years)
            {
                var timeline = stepsPerYear[year];
                var bytesPerCell = SeriesCodec.EncodedLength(timeline.Length, variableCount);
                var blockSize = (int)Math.Clamp(request.MemoryBudgetBytes / 2 / Math.Max(1, bytesPerCell), 1, grid.PointCount);
                // Whole grid rows per block: a hyperslab of whole rows is one contiguous read per chunk.
                if (grid.Nx is { } nx && blockSize > nx && blockSize < grid.PointCount) blockSize -= blockSize % nx;
                var yearExisted = stored.ContainsKey(year);
                var parts = new (int First, int Last, int[] Positions)[fresh.Count];
                for (var k = 0; k < fresh.Count; k++)
                {
                    var (first, last) = YearRange(fresh[k].Times, year);
                    var positions = new int[Math.Max(0, last - first + 1)];
                    for (var t = first; t <= last; t++) positions[t - first] = Array.BinarySearch(timeline, fresh[k].Times[t]);
                    parts[k] = (first, last, positions);
                }
                var shared = SharedSteps.ForYear(timeline, yearExisted ? stored[year] : null, storedMask, request.ReplaceOverlap,
                    parts.Select((part, k) => (part.Positions, MaskOf(fresh[k]))).ToList());
                sharedSteps += shared.Count;
                for (var p0 = 0; p0 < grid.PointCount; p0 += blockSize)
                {
                    cancel.ThrowIfCancellationRequested();
                    var count = Math.Min(blockSize, grid.PointCount - p0);
                    var payloads = new byte[count][];
                    for (var c = 0; c < count; c++) payloads[c] = SeriesCodec.CreateEmpty(timeline.Length, mask);
                    var blockHasData = new bool[count];
                    if (yearExisted)
                    {
                        await pendingWrite;
                        var old = await SeriesStore.ReadYearAsync(connection, transaction, datasetId, year, p0, p0 + count - 1, cancel);
                        CopyStored(old, stored[year], timeline, p0, payloads, blockHasData);
                        await SeriesStore.DeleteAsync(connection, transaction, datasetId, year, p0, p0 + count - 1, cancel);
                    }
                    for (var k = 0; k < fresh.Count; k++)
                    {
                        var file = fresh[k];
                        var (first, last, positions) = parts[k];
                        if (first > last) continue;
                        var slab = (int)Math.Clamp(MaxSlabBytes / (4L * count), 1, positions.Length);
                        var buffer = ArrayPool<float>.Shared.Rent(slab * count);
                        try
                        {
                            for (var t0 = first; t0 <= last; t0 += slab)
                            {
                                var steps = Math.Min(slab, last - t0 + 1);
                                foreach (var (source, target) in Stored)
                                {
                                    if (!file.Has(source)) continue;
                                    file.File.ReadSteps(source, t0, steps, p0, count, buffer.AsSpan(0, steps * count));
                                    bytesRead += 4L * steps * count;
                                    Scatter(file, source, target, buffer, steps, count, p0, t0, t0 - first, positions, mask, timeline.Length,
                                        payloads, blockHasData, candidate,
                                        new SharedStepContext(shared, k, conflicts, h => h == SharedSteps.Stored ? storedName : fresh[h].Name));
                                }
                                doneWork += (long)steps * count;
                                progress?.Report(new ProgressSnapshot($"loading {year}", doneWork, totalWork, bytesRead, clock.Elapsed, "cell-steps"));
                            }
                        }
                        finally
                        {
                            ArrayPool<float>.Shared.Return(buffer);
                            if (p0 + count >= grid.PointCount && YearTimeline.YearOf(file.Times[^1]) <= year) file.Release();
                        }
                        if (depths is not null) CheckNoNegativeDepthAtSea(depths, file, grid, p0, blockHasData);
                    }
                    var chunks = new List<SeriesChunk>();
                    for (var c = 0; c < count; c++)
                    {
                        if (!blockHasData[c] || !candidate[p0 + c]) continue;
                        hasData[p0 + c] = true;
                        chunks.Add(new SeriesChunk(p0 + c, year, payloads[c]));
                    }
                    cellYears += chunks.Count;
                    payloads = null!;
                    // The previous block's buffers are garbage once its COPY is done: collect them before this block is
                    // handed over, so that the process stays within the budget instead of holding several blocks' worth
                    // until the GC gets round to it.
                    await pendingWrite;
                    GC.Collect(2, GCCollectionMode.Forced, blocking: true, compacting: true);
                    // On a pool thread: the COPY's writes mostly complete synchronously and would otherwise run here.
                    pendingWrite = Task.Run(() => SeriesStore.WriteAsync(connection, datasetId, chunks, cancel), cancel);
                }
                await pendingWrite;
                await DatasetStore.UpsertTimelineAsync(connection, transaction, datasetId, year, timeline, cancel);
            }
            // Differences are gathered over the whole load so the refusal names the largest; the transaction then rolls
            // back, so nothing stored changes.
            if (conflicts.Any) throw conflicts.ToException();
        }
        catch
        {
            // Let a COPY in flight end before the transaction is rolled back on this connection.
            try { await pendingWrite; } catch (Exception) { /* the first failure is the one reported */ }
            throw;
        }

        int wetCells;
        int? deepWaterCells = null;
        if (created)
        {
            var cells = new CellRecord[grid.PointCount];
            for (var p = 0; p < cells.Length; p++)
            {
                var (i, j) = grid.IndexOf(p);
                cells[p] = new CellRecord(p, i, j, grid.Longitude(p), grid.Latitude(p), depths?.StoredDepth(p), hasData[p] && candidate[p]);
            }
            await CellStore.InsertAsync(connection, datasetId, cells, cancel);
            if (grid.Triangles is { } triangles) await CellStore.InsertTrianglesAsync(connection, datasetId, triangles, cancel);
            await DatasetStore.UpdateExtentAsync(connection, transaction, datasetId, cancel);
            progress?.Report(new ProgressSnapshot("distances to the coast", 0, 1, bytesRead, clock.Elapsed, "steps"));
            await CellStore.UpdateCoastDistanceAsync(connection, transaction, datasetId, cancel);
            wetCells = cells.Count(c => c.Wet);
            deepWaterCells = cells.Count(c => c.Wet && c.DepthMetres is null);
        }
        else
        {
            var wet = new HashSet<int>(existingWet!);
            var newlyWet = Enumerable.Range(0, grid.PointCount).Where(p => hasData[p] && !wet.Contains(p)).ToArray();
            await CellStore.MarkWetAsync(connection, transaction, datasetId, newlyWet, cancel);
            wetCells = wet.Count + newlyWet.Length;
        }

        foreach (var file in fresh)
            await DatasetStore.InsertSourceFileAsync(connection, transaction, datasetId, new SourceFileRecord(file.Name, file.Sha256, file.SizeBytes,
                DateTimeOffset.FromUnixTimeSeconds(file.Times[0]).UtcDateTime, DateTimeOffset.FromUnixTimeSeconds(file.Times[^1]).UtcDateTime,
                file.Times.Length, request.JobId, DateTime.UtcNow), cancel);
        var assumptions = IngestAssumptions.Build(fresh, depths, deepWaterCells, dataset?.MetadataJson);
        var timelines = stored.Values.Concat(stepsPerYear.Values).ToList();
        var warnings = IngestAssumptions.Warnings(timelines.Where(l => l.Length > 0).Min(l => l[0]), timelines.Where(l => l.Length > 0).Max(l => l[^1]),
            IngestAssumptions.NominalStep(timelines));
        await DatasetStore.MergeMetadataAsync(connection, transaction, datasetId,
            DatasetMetadata.Describe(fresh, mask, depths is not null, assumptions, warnings), cancel);
        await transaction.CommitAsync(cancel);
        return new IngestSummary(request.DatasetSlug, fresh.Count, skipped, freshSteps, cellYears, wetCells, bytesRead, clock.Elapsed, created)
        {
            SharedSteps = sharedSteps,
            Assumptions = assumptions,
            Warnings = warnings,
        };
    }

    /// <summary>The shared-step bookkeeping <see cref="Scatter"/> compares against.</summary>
    private readonly record struct SharedStepContext(SharedSteps Steps, int File, SharedStepConflicts Conflicts, Func<int, string> HolderName);

    /// <summary>
    /// Transposes one slab [step][cell] into the cells' payloads at their time-line positions. At a step an earlier
    /// source gave (stored, or an earlier file) the value already in the payload is compared with the new one and a
    /// difference recorded; the new value is written either way (equal, or the load is refused at its end).
    /// </summary>
    private static void Scatter(SourceFile file, WaveParameter source, WaveParameter target, float[] buffer, int steps, int count, int p0,
        int fileStep0, int positionOffset, int[] positions, int mask, int stepCount, byte[][] payloads, bool[] hasData, bool[] candidate,
        SharedStepContext shared)
    {
        var offset = SeriesCodec.OffsetOf(mask, stepCount, target);
        var isHs = target == WaveParameter.Hs;
        for (var s = 0; s < steps; s++)
        {
            var at = offset + 2 * positions[positionOffset + s];
            var row = s * count;
            var holder = shared.Steps.HolderOf(shared.File, positionOffset + s);
            var compare = holder != SharedSteps.None && (shared.Steps.HolderMaskOf(shared.File, positionOffset + s) & (SeriesCodec.BitOf(target))) != 0;
            for (var c = 0; c < count; c++)
            {
                var value = buffer[row + c];
                ushort q;
                try
                {
                    q = SeriesCodec.Quantise(target, value);
                }
                catch (ArgumentOutOfRangeException)
                {
                    if (!candidate[p0 + c]) continue;
                    throw new IngestException($"{file.Name}: variable '{source}': value {value} at {YearTimeline.Iso(file.Times[fileStep0 + s])}, point {p0 + c} " +
                        $"is outside the physical range 0 to {SeriesCodec.MaximumOf(target)} ({SeriesUnits.Of(target)}); check the units and fill values.");
                }
                if (compare && candidate[p0 + c])
                {
                    var old = BinaryPrimitives.ReadUInt16LittleEndian(payloads[c].AsSpan(at));
                    if (old != q)
                        shared.Conflicts.Record(file.Name, shared.HolderName(holder), file.Times[fileStep0 + s], target, old, q, p0 + c);
                }
                BinaryPrimitives.WriteUInt16LittleEndian(payloads[c].AsSpan(at), q);
                if (isHs && q != SeriesCodec.Missing) hasData[c] = true;
            }
        }
    }

    private static void CopyStored(Dictionary<int, byte[]> old, long[] oldTimeline, long[] timeline, int p0, byte[][] payloads, bool[] hasData)
    {
        var positions = oldTimeline.Select(t => Array.BinarySearch(timeline, t)).ToArray();
        foreach (var (cell, payload) in old)
        {
            var target = payloads[cell - p0];
            var oldSteps = SeriesCodec.StepCountOf(payload);
            for (var v = 0; v < SeriesCodec.VariableCount; v++)
            {
                var variable = WaveParameterGroups.SeriesFields[v];
                if (!SeriesCodec.Has(payload, variable) || !SeriesCodec.Has(target, variable)) continue;
                var from = SeriesCodec.OffsetOf(payload[1], oldSteps, variable);
                var to = SeriesCodec.OffsetOf(target[1], timeline.Length, variable);
                for (var i = 0; i < oldSteps; i++)
                {
                    target[to + 2 * positions[i]] = payload[from + 2 * i];
                    target[to + 2 * positions[i] + 1] = payload[from + 2 * i + 1];
                }
            }
            hasData[cell - p0] = true;
        }
    }

    private static (int First, int Last) YearRange(long[] times, int year)
    {
        var start = new DateTimeOffset(year, 1, 1, 0, 0, 0, TimeSpan.Zero).ToUnixTimeSeconds();
        var end = new DateTimeOffset(year + 1, 1, 1, 0, 0, 0, TimeSpan.Zero).ToUnixTimeSeconds();
        var first = LowerBound(times, start);
        var last = LowerBound(times, end) - 1;
        return (first, last);
    }

    private static int LowerBound(long[] values, long key)
    {
        var index = Array.BinarySearch(values, key);
        return index >= 0 ? index : ~index;
    }

    private static void CheckSameGrid(List<SourceFile> files)
    {
        for (var i = 1; i < files.Count; i++)
            if (!files[i].Grid.IsSameAs(files[0].Grid))
                throw new IngestException($"{files[i].Name}: its grid ({GridDescription.Of(files[i].Grid).Describe()}) differs from the grid of " +
                    $"{files[0].Name} ({GridDescription.Of(files[0].Grid).Describe()}); files of one dataset must share one grid.");
    }

    /// <summary>
    /// Refuses a cell whose depth is negative (the sea floor above the surface, after sign handling) where the file
    /// gives Hs: a wet cell needs a positive depth, and a wrong sign convention would otherwise dry the cell silently.
    /// </summary>
    private static void CheckNoNegativeDepthAtSea(CellDepths depths, SourceFile file, GridDescription grid, int p0, bool[] blockHasData)
    {
        for (var c = 0; c < blockHasData.Length; c++)
        {
            var cell = p0 + c;
            if (!blockHasData[c] || !depths.IsNegative(cell)) continue;
            var (i, j) = grid.IndexOf(cell);
            var index = i is null ? "" : $"i={i}, j={j}, ";
            throw new IngestException($"{depths.FileName}: variable '{depths.Variable}': cell {cell} ({index}lat {grid.Latitude(cell):0.####}, " +
                $"lon {grid.Longitude(cell):0.####}) has a negative depth, {depths.SignedMetres[cell]:G4} m ({depths.Describe()}, positive down), " +
                $"but {file.Name} gives it a wave height: a sea cell needs a positive depth. Check the sign convention (the variable's " +
                "positive attribute, or \"depth_positive\" in the mapping file). Nothing was changed.");
        }
    }

    private static int MaskOf(SourceFile file)
    {
        var mask = 0;
        foreach (var (source, target) in Stored)
            if (file.Has(source)) mask |= SeriesCodec.BitOf(target);
        return mask;
    }

    private static int MaskFromMetadata(string metadataJson)
    {
        using var document = System.Text.Json.JsonDocument.Parse(metadataJson);
        if (!document.RootElement.TryGetProperty("stored_variable_mask", out var value)) return 0;
        return value.GetInt32();
    }
}
