using System.Text.Json;
using Atlas.Hindcast;
using Atlas.Ingest.Progress;
using Atlas.Ingest.Statistics;
using Atlas.Ingest.Worker;
using Atlas.Statistics;
using Atlas.Storage.Jobs;
using Atlas.Storage.Passes;
using Npgsql;

namespace Atlas.Ingest.Ingestion;

/// <summary>
/// The first load of a dataset in parts: <see cref="QueueAsync"/> plans and checks the files as a plain ingest does and
/// queues ranges of whole grid rows as parts that any worker claims; each part reads its cells from every file and
/// writes their series under the dataset id the pass reserved, and the last part creates the dataset
/// (<see cref="HindcastIngestor.RunPartAsync"/>). Readers find datasets by slug, so nothing of it is seen before then.
/// Files for a dataset that exists already share its stored chunks (a year's chunks are rewritten whole), so such a
/// load is queued as one whole ingest job instead, in one transaction as today.
/// </summary>
public sealed class IngestInParts(NpgsqlDataSource dataSource, StatisticsOptions? statistics = null)
{
    /// <summary>Grid points per part unless asked otherwise (rounded to whole grid rows).</summary>
    public const int DefaultPartCells = 8192;

    private readonly HindcastIngestor _ingestor = new(dataSource, statistics);

    /// <summary>
    /// Queues the load of <paramref name="request"/>'s files: in parts of about <paramref name="partCells"/> grid points
    /// when it creates its dataset, else as one whole job. Bad files are refused here (<see cref="IngestException"/>),
    /// before anything is queued; an ingest in parts already open for the slug is refused (<see cref="PassOpenException"/>).
    /// </summary>
    public async Task<QueuedIngest> QueueAsync(IngestPayload payload, string slug, int partCells = DefaultPartCells, CancellationToken cancel = default)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(partCells, 1);
        var mapping = payload.MappingFile is { } m ? VariableMapping.Load(m) : null;
        var request = new IngestRequest(slug, payload.Files, payload.Title, payload.Replace, mapping);
        var files = new List<SourceFile>();
        try
        {
            // Queueing checks the files; their checksums are the business of the part that records the sources.
            files = await SourceFile.OpenAllAsync(request.Files.Distinct().ToList(), mapping, checksumNow: false, cancel: cancel);
            IngestPlan plan;
            await using (var connection = await dataSource.OpenConnectionAsync(cancel))
            await using (var transaction = await connection.BeginTransactionAsync(cancel))
                plan = await IngestPlan.BuildAsync(connection, transaction, request, files, cancel);
            if (plan.Fresh.Count == 0) return new QueuedIngest(slug, null, null, 0);
            if (!plan.CreatesDataset)
            {
                var id = await new JobQueue(dataSource).EnqueueAsync(JobKind.Ingest, slug, JsonSerializer.Serialize(payload with { QueueStatistics = false }), cancel);
                return new QueuedIngest(slug, id, null, plan.Grid.PointCount);
            }
            var rows = plan.Grid.Nx is { } nx && nx > 0 ? Math.Max(1, partCells / nx) * nx : partCells;
            var points = plan.Grid.PointCount;
            var parts = new List<string>();
            for (var first = 0; first < points; first += rows)
                parts.Add(JsonSerializer.Serialize(new IngestPartPayload(payload.Files, payload.Title, payload.MappingFile, first, Math.Min(points, first + rows) - 1)));
            var passes = new PassStore(dataSource);
            var reserved = await passes.ReserveDatasetIdAsync(cancel);
            var passPayload = JsonSerializer.Serialize(new { files = payload.Files, grid_points = points });
            var pass = await passes.OpenAsync(PassKind.Ingest, reserved, slug, passPayload, [], parts, DateTime.UtcNow, cancel: cancel);
            return new QueuedIngest(slug, null, pass, points);
        }
        finally
        {
            foreach (var file in files) file.Dispose();
        }
    }

    /// <summary>Runs one claimed part; returns its summary line.</summary>
    public async Task<string> RunPartAsync(JobRecord part, IProgress<ProgressSnapshot>? progress, CancellationToken cancel)
    {
        var passId = part.PassId ?? throw new ArgumentException($"Job {part.Id} is not a part of a pass.", nameof(part));
        var pass = await new PassStore(dataSource).FindAsync(passId, cancel);
        if (pass is null || pass.State != "open") return $"ingest {part.DatasetSlug} pass {passId} part {part.Part + 1}: nothing to do, the pass has {pass?.State ?? "gone"}";
        var payload = JsonSerializer.Deserialize<IngestPartPayload>(part.PayloadJson) ?? throw new IngestException($"Job {part.Id} has no ingest part payload.");
        var mapping = payload.MappingFile is { } m ? VariableMapping.Load(m) : null;
        var request = new IngestRequest(part.DatasetSlug, payload.Files, payload.Title, false, mapping, part.Id, Cells: new CellRange(payload.FirstCell, payload.LastCell));
        return await _ingestor.RunPartAsync(request, part, pass, progress, cancel);
    }
}

/// <summary>The payload of an ingest part: the files, the new dataset's title and mapping, and its grid points.</summary>
public sealed record IngestPartPayload(string[] Files, string? Title, string? MappingFile, int FirstCell, int LastCell);

/// <summary>What <see cref="IngestInParts.QueueAsync"/> queued: a pass in parts, one whole job, or nothing (every file loaded already).</summary>
public sealed record QueuedIngest(string DatasetSlug, long? WholeJobId, PassRecord? Pass, int GridPoints)
{
    public string Describe() =>
        Pass is { } pass
            ? $"ingest {DatasetSlug}: pass {pass.Id} queued in {pass.PartCount} part(s) of its {GridPoints:N0} grid points; any worker runs them " +
              "(atlas worker), and the dataset appears once every part is done (atlas jobs shows the progress)"
            : WholeJobId is { } id
                ? $"ingest {DatasetSlug}: job {id} queued whole: the dataset exists, and a load into it rewrites the years it touches in one transaction"
                : $"ingest {DatasetSlug}: nothing new (every file is loaded already); nothing queued";
}
