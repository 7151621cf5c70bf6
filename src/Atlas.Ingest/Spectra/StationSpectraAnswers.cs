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
        AnalysisWindow window, IReadOnlyDictionary<int, long[]> timelines, CancellationToken cancel)
    {
        var chunks = await series.ReadCellAsync(dataset.Id, cellId, window.FirstYear, window.LastYear, cancel);
        if (chunks.Count == 0) return null;
        var aligned = await AlignedStepsAsync(dataset.Id, cellId, chunks, timelines, cancel);
        var (power, parametric, width) = (aligned[SpectralProduct.Power], aligned[SpectralProduct.ParametricPower], aligned[SpectralProduct.SpectralWidth]);
        ExactPointStatistics spectral, bulk;
        long[] times;
        using (var decoded = PointSeriesReader.DecodeRented(chunks, timelines, depth ?? double.NaN))
        {
            var exact = new ExactPointOptions { Window = window, Statistics = options };
            times = decoded.Times.ToArray();
            var calendar = new TimelineCalendar(decoded.Times);
            spectral = ExactPointAnalysis.Analyse(decoded.ToCellSeries() with { Power = power }, exact, calendar);
            bulk = ExactPointAnalysis.Analyse(decoded.ToCellSeries() with { Power = parametric }, exact, calendar);
        }
        var months = (await store.MonthSumsAsync(dataset.Id, cellId, cancel))
            .Select(m => new MonthSpectrum(m.Year, m.Month, m.Steps, m.FrequencySum, m.DirectionSum)).ToList();
        var (frequencies, directions, station) = Axes(dataset, cellId);
        var periods = spectral.Periods.Select(p => p.Period).ToList();
        var spectra = PeriodSpectra.Of(months, periods, window, directions).ToDictionary(p => p.Period);
        var result = new List<SpectralPeriod>();
        foreach (var p in spectral.Periods)
        {
            double meanSpectral = p.J.Mean, meanParametric = bulk.Find(p.Period)?.J.Mean ?? double.NaN;
            spectra.TryGetValue(p.Period, out var s);
            result.Add(new SpectralPeriod(p.Period, p.J.Count, meanSpectral, meanParametric, meanParametric / meanSpectral,
                s?.DirectionalityCoefficient ?? double.NaN, s?.MaxPowerFromDeg ?? double.NaN, PooledMean(times, width, p.Period, window),
                s?.FrequencySpectrum ?? [], s?.DirectionPower ?? []));
        }
        return new SpectralPointAnswer(dataset.Slug, station, cellId, lat, lon, depth, distanceKm, frequencies, directions, result, Method);
    }

    /// <summary>The period's directionality and direction of largest resolved power from the monthly spectra, for the main answer's periods.</summary>
    public async Task<IReadOnlyDictionary<AtlasPeriod, PeriodSpectrum>> PeriodSpectraAsync(DatasetRecord dataset, int cellId, IReadOnlyList<AtlasPeriod> periods,
        AnalysisWindow window, CancellationToken cancel)
    {
        var months = (await store.MonthSumsAsync(dataset.Id, cellId, cancel))
            .Select(m => new MonthSpectrum(m.Year, m.Month, m.Steps, m.FrequencySum, m.DirectionSum)).ToList();
        return PeriodSpectra.Of(months, periods, window, Axes(dataset, cellId).Directions).ToDictionary(p => p.Period);
    }

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

    private static double PooledMean(long[] times, float[] values, AtlasPeriod period, AnalysisWindow window)
    {
        double sum = 0;
        long count = 0;
        for (int k = 0; k < times.Length; k++)
        {
            float v = values[k];
            if (float.IsNaN(v)) continue;
            var at = DateTimeOffset.FromUnixTimeSeconds(times[k]).UtcDateTime;
            if (!window.Contains(at.Year, at.Month)) continue;
            bool inside = period.Kind switch
            {
                PeriodKind.Annual => true,
                PeriodKind.Month => AtlasPeriod.Month(at.Month) == period,
                PeriodKind.Season => AtlasPeriod.SeasonOf(at.Month) == period,
                PeriodKind.Year => AtlasPeriod.Year(at.Year) == period,
                _ => false,
            };
            if (!inside) continue;
            sum += v;
            count++;
        }
        return count == 0 ? double.NaN : sum / count;
    }

    /// <summary>The datasets of output points that name <paramref name="gridSlug"/> as their gridded dataset.</summary>
    public static IEnumerable<DatasetRecord> CompanionsOf(IEnumerable<DatasetRecord> datasets, string gridSlug) =>
        datasets.Where(d => d.GridKind == StationsKind && JsonNode.Parse(d.MetadataJson)?["spectra"]?["grid_dataset"]?.GetValue<string>() == gridSlug);
}
