using System.Diagnostics;
using System.Text.Json.Nodes;
using System.Threading.Channels;
using Atlas.Ingest.Ingestion;
using Atlas.Ingest.Progress;
using Atlas.Statistics;
using Atlas.Statistics.Calendar;
using Atlas.Statistics.Spectral;
using Atlas.Storage.Cells;
using Atlas.Storage.Datasets;
using Atlas.Storage.Passes;
using Atlas.Storage.Series;
using Atlas.Storage.Statistics;
using Npgsql;

namespace Atlas.Ingest.Statistics;

/// <summary>
/// Computes and stores the statistics of a dataset's cells whose series changed since they were last computed
/// (or of all cells; a changed cell's whole block of 1,024 cell ids is recomputed, since blocks are stored whole). One
/// streaming pass in four stages joined by bounded channels: produce (<see cref="CellSeriesProducer"/>: chunks come out
/// of PostgreSQL by binary COPY ordered by cell, each cell's series is assembled once), calculate
/// (<see cref="CellCalculators"/>: a calculator per core computes every period), assemble
/// (<see cref="StatisticBlockAssembler"/>: results packed per block) and write (<see cref="StatisticBatchWriter"/>:
/// blocks go back by binary COPY in batches). Memory is bounded by the cell buffers and the few open blocks in flight,
/// whatever the dataset size. The options used are recorded with the statistics; statistics of an earlier method or
/// of other options are all recomputed.
/// </summary>
/// <param name="options">The statistics options (the host binds them from the <c>Statistics</c> configuration section);
/// the published defaults when none are given.</param>
public sealed class StatisticsService(NpgsqlDataSource dataSource, StatisticsOptions? options = null)
{
    private readonly StatisticsOptions _options = Checked(options ?? new StatisticsOptions());
    private const int CellsPerBatch = 1024;
    private const int WriterConnections = 2;

    public async Task<StatisticsSummary> RunAsync(string slug, bool all, IProgress<ProgressSnapshot>? progress = null, CancellationToken cancel = default)
    {
        var clock = Stopwatch.StartNew();
        HotMethodWarmup.Start();
        var plan = await PlanAsync(slug, all, cancel);
        if (plan.Targets.Length == 0) return new StatisticsSummary(slug, 0, 0, 0, 0, clock.Elapsed);
        // A pass in parts publishes its blocks at its end: a plain pass under way meanwhile would interleave with it.
        if (await new PassStore(dataSource).OpenPassAsync(slug, cancel) is { } open) throw new PassOpenException(slug, open.Id, open.Kind);
        var datasets = new DatasetStore(dataSource);
        if (UnsettledMetadata(plan) is { } unsettled) await datasets.MergeMetadataAsync(plan.Dataset.Id, unsettled, cancel);
        var timeline = DatasetTimeline.Of(await datasets.TimelinesAsync(plan.Dataset.Id, cancel));
        var computedAt = DateTime.UtcNow;
        var store = new StatisticsStore(dataSource);
        var (done, periods, rows) = await ComputeAsync(plan.Dataset.Id, plan.Cells, plan.Targets, plan.Targets.Length == plan.Cells.Count ? null : plan.Targets,
            timeline, (batch, token) => store.ReplaceBlocksAsync(plan.Dataset.Id, batch.Cells, batch.Blocks, computedAt, token), progress, clock, cancel);
        await datasets.MergeMetadataAsync(plan.Dataset.Id, MethodNotes(computedAt, plan.Dataset.GridKind == Spectra.StationSpectraAnswers.StationsKind), cancel);
        return new StatisticsSummary(slug, done, periods, rows, (long)done * timeline.Times.Length, clock.Elapsed, plan.MethodChanged, plan.OptionsChanged);
    }

    /// <summary>
    /// What a pass over <paramref name="slug"/> recomputes: the wet cells whose series changed (whole blocks), or every
    /// wet cell when asked, or when the stored statistics came from another method version or other options.
    /// </summary>
    internal async Task<StatisticsPlan> PlanAsync(string slug, bool all, CancellationToken cancel)
    {
        var dataset = await new DatasetStore(dataSource).FindAsync(slug, cancel) ?? throw new IngestException($"There is no dataset '{slug}'.");
        var cells = (await new CellStore(dataSource).AllAsync(dataset.Id, cancel)).Where(c => c.Wet).ToDictionary(c => c.CellId);
        // Statistics of an earlier method or of other options are all recomputed, whatever changed: old and new values never mix.
        var methodChanged = !all && StoredMethodVersion(dataset.MetadataJson) is { } stored && stored != Atlas.Statistics.MethodNotes.Version;
        var optionsChanged = !all && !methodChanged && RecordedStatisticsOptions.Differ(dataset.MetadataJson, _options);
        all |= methodChanged || optionsChanged;
        var targets = all ? cells.Keys.Order().ToArray() : WholeBlocks(await new StatisticsStore(dataSource).StaleCellsAsync(dataset.Id, cancel), cells.Keys);
        return new StatisticsPlan(dataset, cells, targets, all, methodChanged, optionsChanged);
    }

    /// <summary>
    /// Until a pass of every cell with other options ends, the stored statistics are partly of either options: the
    /// metadata to merge as the pass begins says so, so that a pass that fails half-way is followed by one that
    /// recomputes every cell. Null when the pass keeps the recorded options.
    /// </summary>
    internal string? UnsettledMetadata(StatisticsPlan plan) =>
        plan.All && RecordedStatisticsOptions.Differ(plan.Dataset.MetadataJson, _options) ? RecordedStatisticsOptions.Unsettled(plan.Dataset.MetadataJson) : null;

    /// <summary>
    /// Runs the four stages over <paramref name="targets"/>; returns the cells stored, the periods and the rows. The
    /// first stage to fail cancels the others, and its error is the one reported.
    /// </summary>
    /// <param name="onlyCells">The cells to stream, or null for every cell of the dataset (when the targets are all of them).</param>
    /// <param name="store">Stores one batch of whole blocks, in one transaction.</param>
    internal async Task<(int Cells, int Periods, long Rows)> ComputeAsync(int datasetId, IReadOnlyDictionary<int, CellRecord> cells, int[] targets,
        int[]? onlyCells, DatasetTimeline timeline, Func<StatisticBatch, CancellationToken, Task> store, IProgress<ProgressSnapshot>? progress,
        Stopwatch clock, CancellationToken cancel)
    {
        var workers = Math.Max(1, Environment.ProcessorCount);
        var free = Channel.CreateUnbounded<CellSeriesBuffer>();
        for (var i = 0; i < 2 * workers + 2; i++) free.Writer.TryWrite(new CellSeriesBuffer(timeline.Times.Length));
        var work = Channel.CreateBounded<CellSeriesBuffer>(workers * 2);
        var results = Channel.CreateBounded<CellResult>(workers * 4);
        var batches = Channel.CreateBounded<StatisticBatch>(2);
        using var linked = CancellationTokenSource.CreateLinkedTokenSource(cancel);
        var token = linked.Token;

        // What output points add from their spectra, read side by side before the cells stream.
        var spectralPower = SpectralPowerAsync(datasetId, cancel);
        var spectralDirectionality = SpectralDirectionalityAsync(datasetId, targets, timeline, cancel);
        var producer = new CellSeriesProducer(new SeriesStore(dataSource), datasetId, cells, onlyCells, timeline)
        {
            SpectralPower = await spectralPower,
        };
        var produced = Task.Run(() => producer.RunAsync(free.Reader, work.Writer, token), token);
        var rowLists = new RowListPool();
        var calculators = new CellCalculators(_options, timeline.Times, workers)
        {
            RowLists = rowLists,
            SpectralDirectionality = await spectralDirectionality,
        };
        var calculated = calculators.Start(work.Reader, free.Writer, results.Writer, token);
        var writer = new StatisticBatchWriter(store, targets.Length, progress, clock);
        var written = writer.Start(batches.Reader, WriterConnections, linked);
        var assembler = new StatisticBlockAssembler(targets, CellsPerBatch) { RowLists = rowLists };
        try
        {
            await assembler.RunAsync(results.Reader, batches.Writer, token);
            await produced;
            await Task.WhenAll(calculators.Workers);
            await calculated;
            await written;
        }
        catch (Exception e)
        {
            await linked.CancelAsync();
            // Report the stage that failed first, not the cancellation it caused elsewhere.
            var first = writer.Writers.Append(produced).Concat(calculators.Workers).FirstOrDefault(t => t.IsFaulted)?.Exception?.InnerException;
            if (first is not null && e is OperationCanceledException && !cancel.IsCancellationRequested)
                System.Runtime.ExceptionServices.ExceptionDispatchInfo.Throw(first);
            throw;
        }
        return (writer.CellsDone, assembler.Periods, assembler.Rows);
    }

    /// <summary>
    /// The power integrated from the spectra of every station-year of a dataset of output points (small: five values per
    /// station and step are stored, and a points dataset has tens of stations); null for gridded fields.
    /// </summary>
    private async Task<IReadOnlyDictionary<(int Cell, int Year), float[]>?> SpectralPowerAsync(int datasetId, CancellationToken cancel)
    {
        await using var connection = await dataSource.OpenConnectionAsync(cancel);
        var power = await Atlas.Storage.Spectra.StationSpectraStore.ReadSpectralPowerAsync(connection, datasetId, cancel);
        return power.Count == 0 ? null : power;
    }

    /// <summary>
    /// For a dataset of output points: the directionality coefficient of every period of every target station from its
    /// period-mean directionally resolved power (the monthly sums of its spectra, month-balanced like every period mean;
    /// IEC TS 62600-101), which replaces the one modelled from direction and spread; null for gridded fields.
    /// </summary>
    private async Task<IReadOnlyDictionary<(int Cell, AtlasPeriod Period), double>?> SpectralDirectionalityAsync(int datasetId, int[] targets,
        DatasetTimeline timeline, CancellationToken cancel)
    {
        var dataset = await new DatasetStore(dataSource).FindByIdAsync(datasetId, cancel);
        if (dataset?.GridKind != Spectra.StationSpectraAnswers.StationsKind) return null;
        if (JsonNode.Parse(dataset.MetadataJson)?["spectra"]?["directions_from_deg"] is not JsonArray bins || bins.Count == 0) return null;
        var directions = bins.Select(v => v!.GetValue<double>()).ToArray();
        var years = timeline.Times.Select(t => DateTimeOffset.FromUnixTimeSeconds(t).Year).Distinct().Select(AtlasPeriod.Year);
        var periods = AtlasPeriod.StandardPeriods.Concat(years).ToList();
        var sums = await new Atlas.Storage.Spectra.StationSpectraStore(dataSource).MonthSumsOfCellsAsync(datasetId, targets, cancel);
        var result = new Dictionary<(int, AtlasPeriod), double>();
        foreach (int cell in targets)
        {
            var months = Spectra.StationSpectraAnswers.MonthSpectra(sums.GetValueOrDefault(cell, []));
            foreach (var period in PeriodSpectra.Of(months, periods, new AnalysisWindow(null, null, null), directions))
                result[(cell, period.Period)] = period.DirectionalityCoefficient;
        }
        return result;
    }

    private static StatisticsOptions Checked(StatisticsOptions options)
    {
        options.Validate();
        return options;
    }

    /// <summary>The method version of a dataset's stored statistics: null before any pass, 1 for passes that recorded none.</summary>
    public static int? StoredMethodVersion(string metadataJson)
    {
        var root = JsonNode.Parse(metadataJson) as JsonObject;
        if (root?["statistics"] is not JsonObject notes) return null;
        return notes["method_version"] is JsonValue v && v.TryGetValue(out int version) ? version : 1;
    }

    /// <summary>The wet cells of every block that holds a stale cell: blocks are stored whole, so they are computed whole.</summary>
    private static int[] WholeBlocks(int[] stale, IEnumerable<int> wetCells)
    {
        var blocks = stale.Select(StatisticBlock.BlockOf).ToHashSet();
        return wetCells.Where(c => blocks.Contains(StatisticBlock.BlockOf(c))).Order().ToArray();
    }

    /// <summary>The method notes a pass records in the dataset's metadata (member <c>statistics</c>), as a JSON object.</summary>
    internal string MethodNotes(DateTime computedAt, bool outputPoints)
    {
        var notes = new JsonObject
        {
            ["statistics"] = new JsonObject
            {
                ["computed_at"] = computedAt.ToString("O"),
                ["method_version"] = Atlas.Statistics.MethodNotes.Version,
                ["software_version"] = typeof(StatisticsService).Assembly.GetName().Version?.ToString(),
                ["power"] = outputPoints
                    ? "omnidirectional power per time step integrated from the output point's spectrum, J = rho g sum cg(f, h) S(f) df with each " +
                      "frequency's group velocity at the station depth (trapezoidal rule over the given frequencies; rho 1025 kg/m3, g 9.81 m/s2), " +
                      "then averaged. The point answers give the power from Hm0 and Te beside it. The directionality coefficient of every period, " +
                      "in the layers and the point answers alike, is the largest period-mean J_theta of the spectra over the period-mean J (monthly " +
                      "sums of each direction bin's power, month-balanced)"
                    : "omnidirectional power per time step from Hm0 and Te with the linear-theory group velocity at Te and the cell depth " +
                      "(rho 1025 kg/m3, g 9.81 m/s2; deep water where the depth is unknown), then averaged; never from mean Hs and mean Te",
                ["energy_period"] = $"Te from the source; where absent, assumed from Tp for the {Atlas.Statistics.MethodNotes.AssumedSpectrum(_options.AssumedSpectrum)}",
                ["direction"] = "power-weighted circular mean of the direction waves come from; 16-sector power rose",
                ["directionality"] = outputPoints
                    ? "from the spectra: the largest period-mean directionally resolved power J_theta over the period-mean power (IEC TS 62600-101)"
                    : Atlas.Statistics.MethodNotes.Directionality,
                ["percentiles_layers"] = $"from fixed-bin histograms: Hs {_options.HsBinning.BinWidth} m, Te/Tp {_options.PeriodBinning.BinWidth} s, " +
                                         $"J {_options.PowerBinning.BinWidth} kW/m, spread {_options.SpreadBinning.BinWidth} degree",
                ["percentiles_points"] = "exact, from the stored series (linear interpolation between order statistics, NumPy's default)",
                ["coverage"] = Atlas.Statistics.MethodNotes.Coverage(_options.LowCoverageThreshold),
                ["climatology"] = Atlas.Statistics.MethodNotes.Climatology,
                ["weighted_percentiles"] = Atlas.Statistics.MethodNotes.WeightedPercentiles,
                ["inter_annual"] = Atlas.Statistics.MethodNotes.InterAnnual,
                ["hs_thresholds_m"] = new JsonArray(_options.HsThresholdsMetres.Select(v => (JsonNode)JsonValue.Create(v)).ToArray()),
                ["j_thresholds_kw_per_m"] = new JsonArray(_options.PowerThresholdsKilowattsPerMetre.Select(v => (JsonNode)JsonValue.Create(v)).ToArray()),
                ["exceedance_thresholds"] = $"Hs {string.Join(", ", _options.HsThresholdsMetres)} m; J {string.Join(", ", _options.PowerThresholdsKilowattsPerMetre)} kW/m",
                ["seasons"] = Atlas.Statistics.MethodNotes.Seasons,
                [RecordedStatisticsOptions.Member] = RecordedStatisticsOptions.ToJson(_options),
            },
        };
        return notes.ToJsonString();
    }
}

/// <summary>What a statistics pass recomputes (<see cref="StatisticsService.PlanAsync"/>).</summary>
/// <param name="Cells">The dataset's wet cells, by id.</param>
/// <param name="Targets">The cells to recompute, ascending: whole blocks of cells.</param>
/// <param name="All">True when every wet cell is recomputed.</param>
internal sealed record StatisticsPlan(DatasetRecord Dataset, Dictionary<int, CellRecord> Cells, int[] Targets, bool All, bool MethodChanged,
    bool OptionsChanged);
