using System.Buffers;
using System.Diagnostics;
using Atlas.Ingest.Progress;
using Atlas.Storage.Datasets;
using Atlas.Storage.Series;
using Npgsql;

namespace Atlas.Ingest.Ingestion;

/// <summary>
/// The second stage of an ingest: loads a plan's years block by block. For each block of cells it reads the block's
/// steps from every new file with hyperslab reads, scatters them onto the cells' time lines (after the year's stored
/// steps, when the year exists) and writes the block by binary COPY while the next block is read. Everything runs in
/// the caller's transaction; the load is refused at the end, naming the largest difference, when a step given twice
/// differs. A part of an ingest in parts loads its range of cells (the request's <see cref="IngestRequest.Cells"/>)
/// and leaves the time lines to the part that creates the dataset (<paramref name="writeTimelines"/> false).
/// </summary>
public sealed class BlockLoader(NpgsqlConnection connection, NpgsqlTransaction transaction, IngestPlan plan, int datasetId,
    IProgress<ProgressSnapshot>? progress, Stopwatch clock, bool writeTimelines = true)
{
    private readonly CellRange _cells = plan.Request.Cells ?? new CellRange(0, plan.Grid.PointCount - 1);

    /// <summary>
    /// The largest float buffer of one hyperslab read (two take turns): steps read at once are bounded by it. 16 MB
    /// (over a thousand steps of a 3,600-cell block) reads as fast as 32 MB did and keeps 32 MB less in memory.
    /// </summary>
    private const int MaxSlabBytes = 16 << 20;

    private readonly SharedStepConflicts _conflicts = new();
    private readonly string _storedName = $"dataset '{plan.Request.DatasetSlug}' (already stored)";
    private long TotalWork => (long)plan.FreshSteps * _cells.Count;
    private long _doneWork;

    /// <summary>Per grid point: did the load store a series with a wave height for it?</summary>
    public bool[] HasData { get; } = new bool[plan.Grid.PointCount];

    public long BytesRead { get; private set; }
    public int CellYears { get; private set; }

    /// <summary>Steps given twice (stored or in two files) with identical values, stored once.</summary>
    public int SharedStepCount { get; private set; }

    public async Task LoadAsync(CancellationToken cancel)
    {
        var years = plan.Years.Select(y => YearPlan.For(plan, y)).ToList();
        // Two blocks take turns: the COPY of one runs while the next is read and transposed (the connection serves one
        // command at a time, so the COPY is awaited before any other use of it). Each holds half the memory budget, is
        // allocated once for the whole load and reused block after block, so memory stays at the budget throughout.
        var capacity = years.Max(y => y.BlockBytes);
        CellBlock[] blocks = [new(capacity, plan.Candidate), new(capacity, plan.Candidate)];
        var turn = 0;
        var pendingWrite = Task.CompletedTask;
        try
        {
            foreach (var year in years)
            {
                SharedStepCount += year.Shared.Count;
                foreach (var (p0, count) in BlocksOf(year, first: year == years[0]))
                {
                    cancel.ThrowIfCancellationRequested();
                    // The other block's COPY was awaited before this block's last one began: this one is free.
                    var block = blocks[turn];
                    turn ^= 1;
                    block.Begin(year.Year, p0, count, year.Timeline.Length, plan.Mask);
                    if (year.StoredTimeline is not null)
                    {
                        await pendingWrite;
                        await ReplaceStoredAsync(year, block, cancel);
                    }
                    ReadFiles(year, block, cancel);
                    var chunks = block.Chunks();
                    foreach (var chunk in chunks) HasData[chunk.CellId] = true;
                    CellYears += chunks.Count;
                    await pendingWrite;
                    // On a pool thread: the COPY's writes mostly complete synchronously and would otherwise run here.
                    pendingWrite = Task.Run(() => SeriesStore.WriteAsync(connection, datasetId, chunks, cancel), cancel);
                }
                await pendingWrite;
                if (writeTimelines) await DatasetStore.UpsertTimelineAsync(connection, transaction, datasetId, year.Year, year.Timeline, cancel);
            }
            // Differences are gathered over the whole load so the refusal names the largest; the transaction then rolls
            // back, so nothing stored changes.
            if (_conflicts.Any) throw _conflicts.ToException();
        }
        catch
        {
            // Let a COPY in flight end before the transaction is rolled back on this connection.
            try { await pendingWrite; } catch (Exception) { /* the first failure is the one reported */ }
            throw;
        }
    }

    /// <summary>
    /// The blocks of a year's cells (first cell, count): at most <see cref="YearPlan.BlockSize"/> cells each. The load
    /// begins with a block of a quarter of that and one of half (whole grid rows where the grid has rows): nothing is
    /// written before the first block is read, and once the writes begin they set the pace (a block's COPY took as
    /// long as the next block's reads, 0.4-0.55 s each in the benchmark ingest), so small first blocks start them
    /// sooner, and the second is read while the first is written.
    /// </summary>
    private IEnumerable<(int First, int Count)> BlocksOf(YearPlan year, bool first)
    {
        var p0 = _cells.First;
        if (first)
            foreach (var divisor in new[] { 4, 2 })
            {
                var size = Math.Max(1, year.BlockSize / divisor);
                if (plan.Grid.Nx is { } nx && size > nx) size -= size % nx;
                if (_cells.Last + 1 - p0 <= size) break;
                yield return (p0, size);
                p0 += size;
            }
        for (; p0 <= _cells.Last; p0 += year.BlockSize) yield return (p0, Math.Min(year.BlockSize, _cells.Last + 1 - p0));
    }

    /// <summary>Takes the block's stored chunks of the year into the block and deletes them: the block is written whole again.</summary>
    private async Task ReplaceStoredAsync(YearPlan year, CellBlock block, CancellationToken cancel)
    {
        var last = block.FirstCell + block.Count - 1;
        var stored = await SeriesStore.ReadYearAsync(connection, transaction, datasetId, year.Year, block.FirstCell, last, cancel);
        block.CopyStored(stored, year.StoredTimeline!, year.Timeline);
        await SeriesStore.DeleteAsync(connection, transaction, datasetId, year.Year, block.FirstCell, last, cancel);
    }

    /// <summary>
    /// Reads the block's steps of the year from every new file, slab by slab, and scatters them into the block. A slab
    /// is scattered on a pool thread while the next is read (the file is read by this thread alone): two buffers take
    /// turns, and one scatter runs at a time, in the order of the reads, so the block receives the same values in the
    /// same order as a loop doing both in turn.
    /// </summary>
    private void ReadFiles(YearPlan year, CellBlock block, CancellationToken cancel)
    {
        var count = block.Count;
        var lastBlock = block.FirstCell + count > _cells.Last;
        for (var k = 0; k < plan.Fresh.Count; k++)
        {
            var file = plan.Fresh[k];
            var part = year.Parts[k];
            if (part.IsEmpty) continue;
            var shared = new SharedStepCheck(year.Shared, k, _conflicts, h => h == SharedSteps.Stored ? _storedName : plan.Fresh[h].Name);
            var slab = (int)Math.Clamp(MaxSlabBytes / (4L * count), 1, part.Positions.Length);
            float[][] buffers = [ArrayPool<float>.Shared.Rent(slab * count), ArrayPool<float>.Shared.Rent(slab * count)];
            var turn = 0;
            var scatter = Task.CompletedTask;
            try
            {
                for (var t0 = part.First; t0 <= part.Last; t0 += slab)
                {
                    cancel.ThrowIfCancellationRequested();
                    var steps = Math.Min(slab, part.Last - t0 + 1);
                    foreach (var variable in WaveParameterGroups.SeriesFields)
                    {
                        if (!file.Has(variable)) continue;
                        // This buffer's scatter ended before the other buffer's began (awaited below): it is free.
                        var values = buffers[turn];
                        turn ^= 1;
                        file.File.ReadSteps(variable, t0, steps, block.FirstCell, count, values.AsSpan(0, steps * count));
                        BytesRead += 4L * steps * count;
                        scatter.GetAwaiter().GetResult();
                        var slice = new FileSlab(file, part, variable, t0 - part.First, steps);
                        scatter = Task.Run(() => block.Scatter(slice, values.AsSpan(0, slice.Steps * count), shared), CancellationToken.None);
                    }
                    _doneWork += (long)steps * count;
                    progress?.Report(new ProgressSnapshot($"loading {year.Year}", _doneWork, TotalWork, BytesRead, clock.Elapsed, "cell-steps"));
                }
                scatter.GetAwaiter().GetResult();
            }
            finally
            {
                // A read that failed leaves a scatter in flight: it ends before its buffer goes back (its error, if
                // any, comes after the read's).
                try { scatter.Wait(); } catch (AggregateException) { }
                foreach (var buffer in buffers) ArrayPool<float>.Shared.Return(buffer);
                // A file is done with once its last year's last block is read: its chunk caches go now, not at the end.
                if (lastBlock && YearTimeline.YearOf(file.Times[^1]) <= year.Year) file.Release();
            }
            if (plan.Depths is not null) CheckNoNegativeDepthAtSea(plan.Depths, file, block);
        }
    }

    /// <summary>
    /// Refuses a cell whose depth is negative (the sea floor above the surface, after sign handling) where the file
    /// gives Hs: a wet cell needs a positive depth, and a wrong sign convention would otherwise dry the cell silently.
    /// </summary>
    private void CheckNoNegativeDepthAtSea(CellDepths depths, SourceFile file, CellBlock block)
    {
        var grid = plan.Grid;
        for (var c = 0; c < block.Count; c++)
        {
            var cell = block.FirstCell + c;
            if (!block.HasData(c) || !depths.IsNegative(cell)) continue;
            var (i, j) = grid.IndexOf(cell);
            var index = i is null ? "" : $"i={i}, j={j}, ";
            throw new IngestException($"{depths.FileName}: variable '{depths.Variable}': cell {cell} ({index}lat {grid.Latitude(cell):0.####}, " +
                $"lon {grid.Longitude(cell):0.####}) has a negative depth, {depths.SignedMetres[cell]:G4} m ({depths.Describe()}, positive down), " +
                $"but {file.Name} gives it a wave height: a sea cell needs a positive depth. Check the sign convention (the variable's " +
                "positive attribute, or \"depth_positive\" in the mapping file). Nothing was changed.");
        }
    }
}
