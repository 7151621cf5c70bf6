using System.Text.Json.Nodes;
using Atlas.Ingest.Series;
using Atlas.Statistics.Spectral;
using Atlas.Storage.Datasets;
using Atlas.Storage.Series;
using Atlas.Storage.Spectra;
using Npgsql;

namespace Atlas.Ingest.Spectra;

/// <summary>
/// The exact spectral values of output points, for the point answers of their own dataset and of the gridded dataset they
/// belong to: the spectral power per step aligned with a decoded series, and per period the spectral and parametric mean
/// power side by side, the directionality from the period-mean J_theta, the mean spectral width, the mean spectrum and the
/// mean power per direction.
/// </summary>
public sealed class StationSpectraAnswers(NpgsqlDataSource dataSource, StationSpectraStore store, SeriesStore series, StatisticsOptions options)
{
    /// <summary>The grid kind of a dataset of output points.</summary>
    public const string StationsKind = "stations";

    public static string Method =>
        "Per step from the stored spectra: J = rho g sum cg(f, h) S(f) df with each frequency's group velocity at the station depth " +
        "(trapezoidal rule over the given frequencies, rho 1025 kg/m3, g 9.81 m/s2); the parametric J uses Hm0 and Te alone with the " +
        "group velocity of a wave of period Te. Period means are month-balanced like every period statistic. The directionality " +
        "coefficient of a period is the largest period-mean directionally resolved power J_theta over the period-mean J, J_theta " +
        "summed over the direction bins of the spectra (IEC TS 62600-101); max_power_from_deg is the direction of that largest " +
        "J_theta, waves coming from. Spectral width eps0 = sqrt(m0 m-2 / m-1^2 - 1), pooled mean over the period's steps.";

    /// <summary>
    /// The spectral power per step of a station, aligned with <see cref="PointSeriesReader.DecodeRented"/> of the same
    /// chunks and time lines (NaN where a year has no stored spectral values).
    /// </summary>
    public async Task<AlignedStationSteps> AlignedStepsAsync(int datasetId, int cellId, IReadOnlyList<SeriesChunk> chunks,
        IReadOnlyDictionary<int, long[]> timelines, CancellationToken cancel)
    {
        var usable = chunks.Where(c => timelines.TryGetValue(c.Year, out var t) && t.Length == SeriesCodec.StepCountOf(c.Payload)).ToArray();
        await using var connection = await dataSource.OpenConnectionAsync(cancel);
        var stored = await StationSpectraStore.ReadStepsAsync(connection, null, datasetId, usable.Select(c => c.Year).ToArray(), cellId, cancel);
        int total = usable.Sum(c => SeriesCodec.StepCountOf(c.Payload));
        var values = new float[SpectralProducts.Count][];
        for (int k = 0; k < values.Length; k++) values[k] = new float[total];
        int offset = 0;
        foreach (var chunk in usable)
        {
            int n = SeriesCodec.StepCountOf(chunk.Payload);
            if (stored.TryGetValue((cellId, chunk.Year), out var record) && record.PowerSpectral.Length == n)
            {
                float[][] columns = [record.PowerSpectral, record.PowerParametric, record.Directionality, record.MaximumPowerFrom, record.SpectralWidth];
                for (int k = 0; k < values.Length; k++) columns[k].CopyTo(values[k], offset);
            }
            else
                foreach (var column in values) column.AsSpan(offset, n).Fill(float.NaN);
            offset += n;
        }
        return new AlignedStationSteps(values);
    }

    /// <summary>
    /// The answer for one output point over <paramref name="window"/>: its series analysed exactly twice, with the spectral
    /// power and with the parametric one, and its monthly spectra.
    /// </summary>
    public async Task<SpectralPointAnswer?> AnswerAsync(DatasetRecord dataset, int cellId, double lat, double lon, double? depth, double? distanceKm,
        AnalysisWindow window, IReadOnlyDictionary<int, long[]> timelines, CancellationToken cancel) =>
        await RecordAsync(dataset, cellId, depth, timelines, cancel) is { } record ? Answer(dataset, record, lat, lon, depth, distanceKm, window) : null;

    /// <summary>
    /// Everything stored for one output point over every usable year, decoded (null when it has no stored series), for
    /// <see cref="Answer"/> to answer any window from.
    /// </summary>
    public async Task<OutputPointRecord?> RecordAsync(DatasetRecord dataset, int cellId, double? depth, IReadOnlyDictionary<int, long[]> timelines,
        CancellationToken cancel)
    {
        var chunks = await series.ReadCellAsync(dataset.Id, cellId, null, null, cancel);
        if (chunks.Count == 0) return null;
        var aligned = await AlignedStepsAsync(dataset.Id, cellId, chunks, timelines, cancel);
        var decoded = PointSeriesReader.Decode(chunks, timelines, depth ?? double.NaN);
        var usable = chunks.Where(c => timelines.TryGetValue(c.Year, out var t) && t.Length == SeriesCodec.StepCountOf(c.Payload)).ToArray();
        var starts = new int[usable.Length + 1];
        for (int k = 0; k < usable.Length; k++) starts[k + 1] = starts[k] + SeriesCodec.StepCountOf(usable[k].Payload);
        var months = MonthSpectra(await store.MonthSumsAsync(dataset.Id, cellId, cancel));
        var (frequencies, directions, station) = Axes(dataset, cellId);
        return new OutputPointRecord(cellId, station, frequencies, directions, [.. usable.Select(c => (int)c.Year)], starts, decoded, aligned, months);
    }

    /// <summary>
    /// The answer for one output point over <paramref name="window"/> from its record: the steps of the window's years (those
    /// a read of their chunks gives), J analysed exactly with the spectral power and with the parametric one (J's period
    /// summaries alone), the pooled spectral width and the period spectra from the monthly sums.
    /// </summary>
    /// <param name="calendarOf">The calendar of the steps' times, from a caller that keeps recent ones (built afresh when null).</param>
    /// <returns>The answer; null when no stored year of the point is inside the window's years (as when none is read).</returns>
    public SpectralPointAnswer? Answer(DatasetRecord dataset, OutputPointRecord record, double lat, double lon, double? depth, double? distanceKm,
        AnalysisWindow window, Func<ReadOnlySpan<long>, TimelineCalendar>? calendarOf = null)
    {
        var range = record.StepsOf(window.FirstYear, window.LastYear);
        if (range.Start.Value == range.End.Value) return null;
        var s = record.Series;
        var times = s.Times.AsSpan(range);
        var cell = new CellSeries
        {
            Times = times,
            Hs = s.Hs.AsSpan(range),
            Te = s.HasTe ? s.Te.AsSpan(range) : default,
            Tp = s.HasTp ? s.Tp.AsSpan(range) : default,
            Dir = s.HasDir ? s.Dir.AsSpan(range) : default,
            Spread = s.HasSpread ? s.Spread.AsSpan(range) : default,
            DepthMetres = s.DepthMetres,
        };
        // Only J's summaries are read from either analysis: the other parts are not computed.
        var exact = new ExactPointOptions { Window = window, Statistics = options, Parts = ExactParts.None };
        var calendar = calendarOf?.Invoke(times) ?? new TimelineCalendar(times);
        var spectral = ExactPointAnalysis.Analyse(cell with { Power = record.Steps[SpectralProduct.Power].AsSpan(range) }, exact, calendar);
        var bulk = ExactPointAnalysis.Analyse(cell with { Power = record.Steps[SpectralProduct.ParametricPower].AsSpan(range) }, exact, calendar);
        var periods = spectral.Periods.Select(p => p.Period).ToList();
        var spectra = PeriodSpectra.Of(record.Months, periods, window, record.Directions).ToDictionary(p => p.Period);
        var widths = PooledMeans(calendar, record.Steps[SpectralProduct.SpectralWidth].AsSpan(range), periods, window);
        var result = new List<SpectralPeriod>();
        for (int i = 0; i < spectral.Periods.Count; i++)
        {
            var p = spectral.Periods[i];
            double meanSpectral = p.J.Mean, meanParametric = bulk.Find(p.Period)?.J.Mean ?? double.NaN;
            spectra.TryGetValue(p.Period, out var sp);
            result.Add(new SpectralPeriod(p.Period, p.J.Count, meanSpectral, meanParametric, meanParametric / meanSpectral,
                sp?.DirectionalityCoefficient ?? double.NaN, sp?.MaxPowerFromDeg ?? double.NaN, widths[i],
                sp?.FrequencySpectrum ?? [], sp?.DirectionPower ?? []));
        }
        return new SpectralPointAnswer(dataset.Slug, record.Station, record.CellId, lat, lon, depth, distanceKm, record.Frequencies, record.Directions, result, Method);
    }

    /// <summary>Stored monthly sums as the period means take them.</summary>
    public static IReadOnlyList<MonthSpectrum> MonthSpectra(IEnumerable<StationMonthSums> sums) =>
        sums.Select(m => new MonthSpectrum(m.Year, m.Month, m.Steps, m.FrequencySum, m.DirectionSum)).ToList();

    /// <summary>The name of an output point of a dataset of points.</summary>
    public static string StationName(DatasetRecord dataset, int cellId) =>
        JsonNode.Parse(dataset.MetadataJson)?["spectra"]?["stations"]?.AsArray().ElementAtOrDefault(cellId)?["name"]?.GetValue<string>() ?? $"station {cellId + 1}";

    private static (double[] Frequencies, double[] Directions, string Station) Axes(DatasetRecord dataset, int cellId)
    {
        var spectra = JsonNode.Parse(dataset.MetadataJson)?["spectra"]
            ?? throw new InvalidOperationException($"dataset '{dataset.Slug}' has no spectral metadata");
        var frequencies = spectra["frequencies_hz"]!.AsArray().Select(v => v!.GetValue<double>()).ToArray();
        var directions = spectra["directions_from_deg"]!.AsArray().Select(v => v!.GetValue<double>()).ToArray();
        return (frequencies, directions, StationName(dataset, cellId));
    }

    /// <summary>
    /// The plain mean of the valid values of each period (inside the window), every period's sum taken in step order. One
    /// pass: each step adds to its month, its season, its year and the whole window.
    /// </summary>
    private static double[] PooledMeans(TimelineCalendar calendar, ReadOnlySpan<float> values, IReadOnlyList<AtlasPeriod> periods, AnalysisWindow window)
    {
        var index = new Dictionary<AtlasPeriod, int>(periods.Count);
        for (int i = 0; i < periods.Count; i++) index[periods[i]] = i;
        var sums = new double[periods.Count];
        var counts = new long[periods.Count];
        int annual = index.GetValueOrDefault(AtlasPeriod.Annual, -1);
        // Per slot: the indices of its month, season and year among the periods (-1 when not asked or outside the window).
        var slotPeriods = new int[calendar.SlotCount * 3];
        var slotInside = new bool[calendar.SlotCount];
        for (int slot = 0; slot < calendar.SlotCount; slot++)
        {
            int year = calendar.YearOfSlot(slot), month = TimelineCalendar.MonthOfSlot(slot);
            slotInside[slot] = window.Contains(year, month);
            slotPeriods[3 * slot] = index.GetValueOrDefault(AtlasPeriod.Month(month), -1);
            slotPeriods[3 * slot + 1] = index.GetValueOrDefault(AtlasPeriod.SeasonOf(month), -1);
            slotPeriods[3 * slot + 2] = index.GetValueOrDefault(AtlasPeriod.Year(year), -1);
        }
        ReadOnlySpan<int> stepSlots = calendar.StepSlots;
        for (int k = 0; k < values.Length; k++)
        {
            float v = values[k];
            int slot = stepSlots[k];
            if (float.IsNaN(v) || !slotInside[slot]) continue;
            if (annual >= 0) { sums[annual] += v; counts[annual]++; }
            for (int j = 0; j < 3; j++)
                if (slotPeriods[3 * slot + j] is var p and >= 0) { sums[p] += v; counts[p]++; }
        }
        var means = new double[periods.Count];
        for (int i = 0; i < means.Length; i++) means[i] = counts[i] == 0 ? double.NaN : sums[i] / counts[i];
        return means;
    }

    /// <summary>The datasets of output points that name <paramref name="gridSlug"/> as their gridded dataset.</summary>
    public static IEnumerable<DatasetRecord> CompanionsOf(IEnumerable<DatasetRecord> datasets, string gridSlug) =>
        datasets.Where(d => d.GridKind == StationsKind && JsonNode.Parse(d.MetadataJson)?["spectra"]?["grid_dataset"]?.GetValue<string>() == gridSlug);
}
