using System.Diagnostics;
using Atlas.Ingest.Progress;
using Atlas.Ingest.Worker;
using Atlas.Statistics;
using Atlas.Storage.Cells;
using Atlas.Storage.Datasets;
using Atlas.Storage.Jobs;
using Atlas.Storage.Passes;
using Atlas.Storage.Series;
using Atlas.WavePhysics;
using Npgsql;

namespace Atlas.Ingest.Ingestion;

/// <summary>
/// Loads hindcast files into a dataset: transposes time-major fields into cell-major yearly chunks, packs them
/// (<see cref="Atlas.Storage.Series.SeriesCodec"/>) and writes them with binary COPY. Everything happens in one transaction, so a failed
/// or killed ingest leaves nothing visible and the same command can simply be run again. A file already loaded
/// (same checksum) is skipped. A time step given twice (already stored, or in two of the files, as monthly files that
/// share their boundary step) is stored once when its values are identical, and refused naming the step, the variable
/// and the largest difference when they are not, unless the request replaces stored steps.
/// Memory stays within the request's budget: cells are processed in blocks, each read with hyperslab reads.
/// The stages: open the files, plan and validate (<see cref="IngestPlan"/>), load block by block
/// (<see cref="BlockLoader"/>), then record the cells, the source files and the metadata, and commit.
/// </summary>
/// <param name="statistics">The statistics options, whose assumed spectrum the recorded assumptions state (Te from Tp);
/// the published defaults when none are given.</param>
public sealed class HindcastIngestor(NpgsqlDataSource dataSource, StatisticsOptions? statistics = null)
{
    private readonly SpectrumShape _assumedSpectrum = (statistics ?? new StatisticsOptions()).AssumedSpectrum;

    public Task<IngestSummary> RunAsync(IngestRequest request, IProgress<ProgressSnapshot>? progress = null, CancellationToken cancel = default) =>
        WithFilesAsync(request, progress, (files, clock) => LoadAsync(request, files, progress, clock, cancel), cancel);

    /// <summary>
    /// Runs one part of an ingest in parts (<see cref="IngestInParts"/>): loads the request's range of cells of a new
    /// dataset under the id the pass reserved, in one transaction that also marks the part done; the part that is done
    /// last creates the dataset row, its cells, time lines, source files and metadata in the same transaction. Returns
    /// the part's summary line. Throws <see cref="PartLostException"/> when the part was taken from this worker.
    /// </summary>
    public Task<string> RunPartAsync(IngestRequest request, JobRecord part, PassRecord pass, IProgress<ProgressSnapshot>? progress, CancellationToken cancel) =>
        WithFilesAsync(request, progress, (files, clock) => LoadPartAsync(request, part, pass, files, progress, clock, cancel), cancel,
            checksumNow: false);

    /// <summary>
    /// Opens the request's files (checksums, grids, times), runs <paramref name="load"/> with them and closes them. A part
    /// of an ingest in parts opens them with <paramref name="checksumNow"/> false: only the part that completes the pass
    /// records the sources and computes their checksums.
    /// </summary>
    private static async Task<T> WithFilesAsync<T>(IngestRequest request, IProgress<ProgressSnapshot>? progress,
        Func<List<SourceFile>, Stopwatch, Task<T>> load, CancellationToken cancel, bool checksumNow = true)
    {
        var clock = Stopwatch.StartNew();
        if (request.Files.Count == 0) throw new IngestException("No files were given to ingest.");
        var files = new List<SourceFile>();
        try
        {
            var paths = request.Files.Distinct().ToList();
            files = await SourceFile.OpenAllAsync(paths, request.Mapping,
                opened => progress?.Report(new ProgressSnapshot("opening files", opened, paths.Count, 0, clock.Elapsed, "files")), checksumNow, cancel);
            return await load(files, clock);
        }
        finally
        {
            foreach (var file in files) file.Dispose();
        }
    }

    private async Task<string> LoadPartAsync(IngestRequest request, JobRecord part, PassRecord pass, List<SourceFile> files,
        IProgress<ProgressSnapshot>? progress, Stopwatch clock, CancellationToken cancel)
    {
        var name = $"ingest {request.DatasetSlug} pass {pass.Id} part {part.Part + 1} of {pass.PartCount}";
        await using var connection = await dataSource.OpenConnectionAsync(cancel);
        await using var transaction = await connection.BeginTransactionAsync(cancel);
        var plan = await IngestPlan.BuildAsync(connection, transaction, request, files, cancel);
        if (!plan.CreatesDataset)
            throw new IngestException($"dataset '{request.DatasetSlug}' was created by another load while this ingest in parts ran; nothing of it was kept.");
        var loader = new BlockLoader(connection, transaction, plan, pass.DatasetId, progress, clock, writeTimelines: false);
        await loader.LoadAsync(cancel);
        var cells = request.Cells ?? new CellRange(0, plan.Grid.PointCount - 1);
        var summary = $"{name}: grid points {cells.First:N0} to {cells.Last:N0}, {loader.CellYears:N0} cell-years, {loader.BytesRead / 1e6:F0} MB in " +
                      ProgressSnapshot.FormatDuration(clock.Elapsed);
        var (outcome, _) = await PassStore.MarkPartDoneAsync(connection, transaction, part, part.ClaimedBy ?? "", summary, cancel);
        switch (outcome)
        {
            case PartOutcome.Lost:
                throw new PartLostException(part.Id, part.ClaimedBy);
            case PartOutcome.PassGone:
                return $"{summary}; the pass ended meanwhile, so nothing of this part was kept";
            case PartOutcome.Stored:
                await transaction.CommitAsync(cancel);
                return summary;
        }
        // The last part: the dataset appears with all its series at this commit.
        await DatasetStore.LockForIngestAsync(connection, transaction, request.DatasetSlug, cancel);
        if (await DatasetStore.FindAsync(connection, transaction, request.DatasetSlug, cancel) is not null)
            throw new IngestException($"dataset '{request.DatasetSlug}' was created by another load while this ingest in parts ran; nothing of it was kept.");
        var grid = plan.Grid;
        await DatasetStore.InsertAsync(connection, transaction, request.DatasetSlug, request.Title ?? plan.Fresh[0].Attribute("title") ?? request.DatasetSlug,
            grid.Kind, grid.Nx, grid.Ny, grid.PointCount, grid.ToJson(), "{}", cancel, pass.DatasetId);
        foreach (var year in plan.Years)
            await DatasetStore.UpsertTimelineAsync(connection, transaction, pass.DatasetId, year, plan.MergedTimelines[year], cancel);
        var hasData = new bool[grid.PointCount];
        foreach (var cell in await SeriesStore.CellsWithSeriesAsync(connection, transaction, pass.DatasetId, cancel)) hasData[cell] = true;
        var (wetCells, deepWaterCells) = await InsertCellsAsync(connection, transaction, plan, pass.DatasetId, hasData, () => { }, cancel);
        await RecordSourcesAsync(connection, transaction, plan, pass.DatasetId, deepWaterCells, _assumedSpectrum, cancel);
        await PassStore.MarkPassDoneAsync(connection, transaction, pass.Id, cancel);
        await transaction.CommitAsync(cancel);
        return $"{summary}{PassStore.PassCompletedNote}: dataset {request.DatasetSlug} created with {wetCells:N0} wet cells of {grid.PointCount:N0}";
    }

    private async Task<IngestSummary> LoadAsync(IngestRequest request, List<SourceFile> files, IProgress<ProgressSnapshot>? progress,
        Stopwatch clock, CancellationToken cancel)
    {
        await using var connection = await dataSource.OpenConnectionAsync(cancel);
        await using var transaction = await connection.BeginTransactionAsync(cancel);
        await DatasetStore.LockForIngestAsync(connection, transaction, request.DatasetSlug, cancel);
        // An ingest in parts of the dataset creates it at its end: a load now would race it for the slug.
        if (await new PassStore(dataSource).OpenPassAsync(request.DatasetSlug, cancel) is { Kind: PassKind.Ingest } open)
            throw new PassOpenException(request.DatasetSlug, open.Id, open.Kind);

        var plan = await IngestPlan.BuildAsync(connection, transaction, request, files, cancel);
        if (plan.Fresh.Count == 0)
            return new IngestSummary(request.DatasetSlug, 0, plan.Skipped, 0, 0, 0, 0, clock.Elapsed, false);
        var grid = plan.Grid;
        var datasetId = plan.Dataset?.Id ?? await DatasetStore.InsertAsync(connection, transaction, request.DatasetSlug,
            request.Title ?? plan.Fresh[0].Attribute("title") ?? request.DatasetSlug, grid.Kind, grid.Nx, grid.Ny, grid.PointCount,
            grid.ToJson(), "{}", cancel);

        var loader = new BlockLoader(connection, transaction, plan, datasetId, progress, clock);
        await loader.LoadAsync(cancel);

        var (wetCells, deepWaterCells) = plan.CreatesDataset
            ? await InsertCellsAsync(connection, transaction, plan, datasetId, loader.HasData, () =>
                progress?.Report(new ProgressSnapshot("distances to the coast", 0, 1, loader.BytesRead, clock.Elapsed, "steps")), cancel)
            : (await MarkNewlyWetAsync(connection, transaction, datasetId, loader.HasData, cancel), (int?)null);
        var (assumptions, warnings) = await RecordSourcesAsync(connection, transaction, plan, datasetId, deepWaterCells, _assumedSpectrum, cancel);
        IReadOnlyList<string> spectralNotes = plan.Fresh[0].Spectra is null ? []
            : await Spectra.SpectralProductWriter.WriteAsync(connection, transaction, plan, datasetId, cancel);
        await transaction.CommitAsync(cancel);
        return new IngestSummary(request.DatasetSlug, plan.Fresh.Count, plan.Skipped, plan.FreshSteps, loader.CellYears, wetCells, loader.BytesRead,
            clock.Elapsed, plan.CreatesDataset)
        {
            SharedSteps = loader.SharedStepCount,
            Assumptions = assumptions,
            Warnings = warnings,
            SpectralNotes = spectralNotes,
        };
    }

    /// <summary>
    /// The cells of a new dataset, wet where a series was stored, with their depths, triangles (a mesh), the extent and
    /// distances to the coast. Returns the wet cells and those of them in deep water (no depth known).
    /// </summary>
    private static async Task<(int Wet, int? DeepWater)> InsertCellsAsync(NpgsqlConnection connection, NpgsqlTransaction transaction, IngestPlan plan,
        int datasetId, bool[] hasData, Action beforeCoastDistance, CancellationToken cancel)
    {
        var grid = plan.Grid;
        var cells = new CellRecord[grid.PointCount];
        for (var p = 0; p < cells.Length; p++)
        {
            var (i, j) = grid.IndexOf(p);
            cells[p] = new CellRecord(p, i, j, grid.Longitude(p), grid.Latitude(p), plan.Depths?.StoredDepth(p), hasData[p] && plan.Candidate[p]);
        }
        await CellStore.InsertAsync(connection, datasetId, cells, cancel);
        if (grid.Triangles is { } triangles) await CellStore.InsertTrianglesAsync(connection, datasetId, triangles, cancel);
        await DatasetStore.UpdateExtentAsync(connection, transaction, datasetId, cancel);
        beforeCoastDistance();
        await CellStore.UpdateCoastDistanceAsync(connection, transaction, datasetId, cancel);
        return (cells.Count(c => c.Wet), cells.Count(c => c.Wet && c.DepthMetres is null));
    }

    /// <summary>Marks wet the cells of an existing dataset that had no series before; returns the wet cells now.</summary>
    private static async Task<int> MarkNewlyWetAsync(NpgsqlConnection connection, NpgsqlTransaction transaction, int datasetId, bool[] hasData,
        CancellationToken cancel)
    {
        var wet = new HashSet<int>(await CellStore.WetCellIdsAsync(connection, transaction, datasetId, cancel));
        var newlyWet = Enumerable.Range(0, hasData.Length).Where(p => hasData[p] && !wet.Contains(p)).ToArray();
        await CellStore.MarkWetAsync(connection, transaction, datasetId, newlyWet, cancel);
        return wet.Count + newlyWet.Length;
    }

    /// <summary>Records the loaded files and merges what the ingest assumed and warns of into the dataset metadata.</summary>
    private static async Task<(IReadOnlyList<VariableAssumption> Assumptions, IReadOnlyList<string> Warnings)> RecordSourcesAsync(
        NpgsqlConnection connection, NpgsqlTransaction transaction, IngestPlan plan, int datasetId, int? deepWaterCells, SpectrumShape assumedSpectrum,
        CancellationToken cancel)
    {
        foreach (var file in plan.Fresh)
            await DatasetStore.InsertSourceFileAsync(connection, transaction, datasetId, new SourceFileRecord(file.Name, file.Checksum, file.SizeBytes,
                DateTimeOffset.FromUnixTimeSeconds(file.Times[0]).UtcDateTime, DateTimeOffset.FromUnixTimeSeconds(file.Times[^1]).UtcDateTime,
                file.Times.Length, plan.Request.JobId, DateTime.UtcNow), cancel);
        var assumptions = IngestAssumptions.Build(plan.Fresh, plan.Depths, deepWaterCells, plan.Dataset?.MetadataJson, assumedSpectrum);
        var timelines = plan.StoredTimelines.Values.Concat(plan.MergedTimelines.Values).Where(l => l.Length > 0).ToList();
        var warnings = IngestAssumptions.Warnings(timelines.Min(l => l[0]), timelines.Max(l => l[^1]), IngestAssumptions.NominalStep(timelines));
        await DatasetStore.MergeMetadataAsync(connection, transaction, datasetId,
            DatasetMetadata.Describe(plan.Fresh, plan.Mask, plan.Depths is not null, assumptions, warnings), cancel);
        return (assumptions, warnings);
    }
}
