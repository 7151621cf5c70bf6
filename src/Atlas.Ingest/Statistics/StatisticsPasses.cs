using System.Diagnostics;
using System.Text.Json;
using System.Text.Json.Nodes;
using Atlas.Ingest.Ingestion;
using Atlas.Ingest.Progress;
using Atlas.Ingest.Worker;
using Atlas.Statistics;
using Atlas.Storage.Cells;
using Atlas.Storage.Datasets;
using Atlas.Storage.Jobs;
using Atlas.Storage.Passes;
using Atlas.Storage.Statistics;
using Npgsql;

namespace Atlas.Ingest.Statistics;

/// <summary>
/// Statistics passes in parts: <see cref="QueueAsync"/> decides what the pass recomputes (as a plain pass does) and
/// queues it as parts of whole blocks of cells; any worker runs a part with <see cref="RunPartAsync"/>. Parts store
/// into the pass's staging table and the last one to finish publishes the whole pass at once (<see cref="PassStore"/>),
/// so the result is the plain pass's, whichever workers ran which parts, and readers never see half of it. A part
/// computes with the options the pass was queued with, whatever the worker's own settings.
/// </summary>
/// <param name="options">The options a queued pass computes with (the host binds them from the <c>Statistics</c>
/// section); the published defaults when none are given.</param>
public sealed class StatisticsPasses(NpgsqlDataSource dataSource, StatisticsOptions? options = null)
{
    /// <summary>Cells per part unless asked otherwise: four blocks of 1,024 cell ids.</summary>
    public const int DefaultPartCells = 4 * StatisticBlock.CellsPerBlock;

    private readonly StatisticsOptions _options = options ?? new StatisticsOptions();

    /// <summary>
    /// Queues a pass over <paramref name="slug"/> in parts of about <paramref name="partCells"/> cell ids (whole blocks);
    /// returns null when no cell needs computing. Throws <see cref="PassOpenException"/> while another pass of the
    /// dataset is open, and <see cref="IngestException"/> for an unknown dataset.
    /// </summary>
    public async Task<QueuedPass?> QueueAsync(string slug, bool all, int partCells = DefaultPartCells, CancellationToken cancel = default)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(partCells, 1);
        var service = new StatisticsService(dataSource, _options);
        var plan = await service.PlanAsync(slug, all, cancel);
        if (plan.Targets.Length == 0) return null;
        var blocks = plan.Targets.Select(StatisticBlock.BlockOf).Distinct().Order().ToArray();
        var blocksPerPart = Math.Max(1, partCells / StatisticBlock.CellsPerBlock);
        var parts = blocks.Chunk(blocksPerPart).Select(b => JsonSerializer.Serialize(new StatisticsPartPayload(b))).ToList();
        var computedAt = DateTime.UtcNow;
        var payload = new JsonObject
        {
            [RecordedStatisticsOptions.Member] = RecordedStatisticsOptions.ToJson(_options),
            ["cells"] = plan.Targets.Length,
            ["all"] = plan.All,
            ["method_changed"] = plan.MethodChanged,
            ["options_changed"] = plan.OptionsChanged,
            ["metadata"] = JsonNode.Parse(service.MethodNotes(computedAt, plan.Dataset.GridKind == Spectra.StationSpectraAnswers.StationsKind)),
        };
        var pass = await new PassStore(dataSource).OpenAsync(PassKind.Statistics, plan.Dataset.Id, slug, payload.ToJsonString(), blocks, parts,
            computedAt, service.UnsettledMetadata(plan), cancel);
        return new QueuedPass(pass, slug, plan.Targets.Length, plan.MethodChanged, plan.OptionsChanged);
    }

    /// <summary>
    /// Runs one claimed part: computes its blocks' wet cells with the pass's options into the pass's staging table,
    /// then marks it done (publishing the pass when it is the last part). Returns the part's one-line summary. Throws
    /// <see cref="PartLostException"/> when the part was taken from this worker meanwhile (its lease lapsed).
    /// </summary>
    public async Task<string> RunPartAsync(JobRecord part, IProgress<ProgressSnapshot>? progress, CancellationToken cancel)
    {
        var clock = Stopwatch.StartNew();
        HotMethodWarmup.Start();
        var passes = new PassStore(dataSource);
        var passId = part.PassId ?? throw new ArgumentException($"Job {part.Id} is not a part of a pass.", nameof(part));
        var name = $"statistics {part.DatasetSlug} pass {passId} part {part.Part + 1}";
        var pass = await passes.FindAsync(passId, cancel);
        if (pass is null || pass.State != "open") return $"{name}: nothing to do, the pass has {pass?.State ?? "gone"}";
        var passOptions = OptionsOf(pass);
        var payload = JsonSerializer.Deserialize<StatisticsPartPayload>(part.PayloadJson)
                      ?? throw new IngestException($"Job {part.Id} has no statistics part payload.");
        var ids = payload.Blocks.SelectMany(b => Enumerable.Range(b * StatisticBlock.CellsPerBlock, StatisticBlock.CellsPerBlock)).ToArray();
        var cells = (await new CellStore(dataSource).ManyAsync(pass.DatasetId, ids, cancel)).Where(c => c.Wet).ToDictionary(c => c.CellId);
        var targets = cells.Keys.Order().ToArray();
        var timeline = DatasetTimeline.Of(await new DatasetStore(dataSource).TimelinesAsync(pass.DatasetId, cancel));
        int done, periods;
        long rows;
        try
        {
            (done, periods, rows) = targets.Length == 0 ? (0, 0, 0L)
                : await new StatisticsService(dataSource, passOptions).ComputeAsync(pass.DatasetId, cells, targets, targets, timeline, async (batch, token) =>
                {
                    if (!await passes.StageAsync(pass.Id, pass.DatasetId, batch.Blocks, token)) throw new PassEndedException();
                }, progress, clock, cancel);
        }
        catch (PassEndedException)
        {
            return $"{name}: stopped, the pass ended meanwhile (another part failed or the dataset was removed)";
        }
        var steps = (long)done * timeline.Times.Length;
        var summary = $"{name} of {pass.PartCount}: {done:N0} cells x {periods} periods ({rows:N0} rows) from {steps:N0} cell-steps in " +
                      $"{ProgressSnapshot.FormatDuration(clock.Elapsed)}";
        var outcome = await passes.FinishPartAsync(part, part.ClaimedBy ?? "", summary, cancel);
        return outcome switch
        {
            PartOutcome.Lost => throw new PartLostException(part.Id, part.ClaimedBy),
            PartOutcome.PassGone => $"{summary}; the pass ended meanwhile, so nothing of this part was kept",
            PartOutcome.PassCompleted => summary + PassStore.PassCompletedNote,
            _ => summary,
        };
    }

    /// <summary>The statistics options a pass was queued with.</summary>
    public static StatisticsOptions OptionsOf(PassRecord pass)
    {
        var payload = JsonNode.Parse(pass.PayloadJson)!.AsObject();
        var metadata = new JsonObject { ["statistics"] = new JsonObject { [RecordedStatisticsOptions.Member] = payload[RecordedStatisticsOptions.Member]?.DeepClone() } };
        return RecordedStatisticsOptions.Read(metadata.ToJsonString())
               ?? throw new IngestException($"Pass {pass.Id} records no statistics options; queue the pass again.");
    }
}

/// <summary>The payload of a part: the blocks of 1,024 cell ids it computes.</summary>
public sealed record StatisticsPartPayload(int[] Blocks);

/// <summary>A pass queued in parts.</summary>
public sealed record QueuedPass(PassRecord Pass, string DatasetSlug, int Cells, bool MethodChanged, bool OptionsChanged)
{
    public string Describe() =>
        $"statistics {DatasetSlug}: pass {Pass.Id} queued in {Pass.PartCount} part(s) over {Cells:N0} cells; any worker runs them (atlas worker), " +
        "and the new statistics are served once every part is done (atlas jobs shows the progress)" +
        (MethodChanged ? "; every cell: the stored statistics came from an earlier version of the method" : "") +
        (OptionsChanged ? "; every cell: the stored statistics were computed with other statistics options (section Statistics)" : "");
}

/// <summary>Thrown inside a part when its pass is no longer open: the part stops and keeps nothing.</summary>
internal sealed class PassEndedException() : Exception("The pass is no longer open.");
