namespace Atlas.Api.Points;

/// <summary>The exact analysis of a located point over a window, the periods it answers and the dataset's provenance.</summary>
/// <param name="Spectral">At an output point its spectral values; at a cell of a gridded dataset those of the nearest
/// output point loaded beside it; null when there is none.</param>
/// <param name="AtOutputPoint">The point is an output point of spectra: its power per step is the one integrated from them.</param>
public sealed record PointAnalysis(LocatedPoint Point, YearWindow Window, ExactPointStatistics Result, IReadOnlyList<PeriodStatistics> Periods, Provenance Source,
    SpectralPointAnswer? Spectral = null, bool AtOutputPoint = false);

/// <summary>
/// The point statistics every caller shares: <c>GET /point</c> (JSON and CSV), the site report and <c>atlas report</c>
/// read the nearest cell's stored series and analyse it here, so that a report prints the very numbers the API answers.
/// </summary>
public sealed class PointStatisticsService(DatasetCatalog catalog, SeriesStore series, ProvenanceBuilder provenance, PointCalendars calendars,
    StatisticsOptions statisticsOptions, StationSpectraAnswers spectra, OutputPoints outputPoints, OutputPointRecords outputPointRecords)
{
    /// <summary>
    /// The most thresholds of the J exceedance curve by default: its step is 1 kW/m, or the smallest 2, 5, 10, 20, 50 ...
    /// kW/m that keeps it to this many up to the largest J (a chart or a script reads no more); a step asked for is kept.
    /// </summary>
    public const int DefaultPowerCurveThresholds = 100;

    /// <summary>
    /// The analysis of the point's cell over the window (every period, or only <paramref name="onlyPeriod"/>), or the
    /// problem when the window holds no series or the period no step. <paramref name="parts"/> leaves out what nobody
    /// reads (the period summaries are always made); <paramref name="powerCurveStep"/> is the J exceedance curve's step
    /// in kW/m, or null for the default (see <see cref="DefaultPowerCurveThresholds"/>).
    /// </summary>
    public async Task<(PointAnalysis? Analysis, ProblemHttpResult? Problem)> AnalyseAsync(LocatedPoint point, YearWindow window, AtlasPeriod? onlyPeriod,
        CancellationToken cancel, ExactParts parts = ExactParts.All, double? powerCurveStep = null)
    {
        var slug = point.Dataset.Slug;
        var timelines = await catalog.TimelinesAsync(point.Dataset, cancel);
        var chunks = await series.ReadCellAsync(point.Dataset.Id, point.Nearest.Cell.CellId, window.FromYear, window.ToYear, cancel);
        if (chunks.Count == 0)
            return (null, ApiProblems.Unprocessable("No series in the window",
                $"Cell {point.Nearest.Cell.CellId} of '{slug}' has no stored series{WindowText(window)}; stored years are " +
                $"{(timelines.Count == 0 ? "none" : $"{timelines.Keys.First()}..{timelines.Keys.Last()}")}."));
        ExactPointStatistics result;
        var analysisWindow = new AnalysisWindow(window.FromYear, window.ToYear, window.Months);
        var atOutputPoint = point.Dataset.GridKind == StationSpectraAnswers.StationsKind;
        var cellId = point.Nearest.Cell.CellId;
        // At an output point the power per step is the one integrated from its spectra, from the point's kept record: the
        // window's years are the steps a read of their chunks decodes to.
        var record = atOutputPoint ? await outputPointRecords.ForAsync(point.Dataset, point.Nearest.Cell, cancel) : null;
        float[]? spectralPower = record is null ? null : record.Steps[SpectralProduct.Power][record.StepsOf(window.FromYear, window.ToYear)];
        using (var decoded = PointSeriesReader.DecodeRented(chunks, timelines, point.Nearest.Cell.DepthMetres is { } d ? d : double.NaN))
        {
            if (spectralPower is not null && spectralPower.Length != decoded.Times.Length)
                throw new InvalidOperationException($"output point {cellId} of '{slug}': {spectralPower.Length} spectral steps for {decoded.Times.Length} series steps");
            result = ExactPointAnalysis.Analyse(decoded.ToCellSeries() with { Power = spectralPower }, new ExactPointOptions
            {
                Window = analysisWindow,
                Statistics = statisticsOptions,
                Parts = parts | ExactParts.OtherSummaries | ExactParts.Directions,
                PowerCurveStepKilowattsPerMetre = powerCurveStep ?? 1.0,
                PowerCurveMaxThresholds = powerCurveStep is null ? DefaultPowerCurveThresholds : null,
            }, calendars.For(decoded.Times));
        }
        var periods = result.Periods.Where(p => onlyPeriod is not { } only || p.Period == only).ToArray();
        SpectralPointAnswer? spectral = null;
        if (record is not null)
        {
            // The directionality of a period from its period-mean J_theta summed over the spectra's direction bins.
            var byPeriod = Atlas.Statistics.Spectral.PeriodSpectra.Of(record.Months, periods.Select(p => p.Period).ToList(), analysisWindow, record.Directions).ToDictionary(p => p.Period);
            periods = periods.Select(p => byPeriod.TryGetValue(p.Period, out var s)
                ? p with { Direction = p.Direction with { DirectionalityCoefficient = s.DirectionalityCoefficient, MaxPowerFromDeg = s.MaxPowerFromDeg } }
                : p).ToArray();
            var c = point.Nearest.Cell;
            spectral = spectra.Answer(point.Dataset, record, c.Latitude, c.Longitude, c.DepthMetres, null, analysisWindow, calendars.For);
        }
        else if (await outputPoints.NearestAsync(point.Dataset, point.Asked.Latitude, point.Asked.Longitude, cancel) is { } nearest
                 && await outputPointRecords.ForAsync(nearest.Dataset, nearest.Cell, cancel) is { } nearestRecord)
            spectral = spectra.Answer(nearest.Dataset, nearestRecord, nearest.Cell.Latitude, nearest.Cell.Longitude, nearest.Cell.DepthMetres,
                nearest.DistanceKm, analysisWindow, calendars.For);
        if (spectral is not null && onlyPeriod is { } one)
            spectral = spectral with { Periods = spectral.Periods.Where(p => p.Period == one).ToList() };
        if (periods.Length == 0)
            return (null, onlyPeriod is { } asked
                ? ApiProblems.Unprocessable("The period has no steps in the window",
                    $"{asked.Name} has no step{WindowText(window)} at cell {point.Nearest.Cell.CellId}; widen the window or choose another period.")
                : ApiProblems.Unprocessable("No steps in the window",
                    $"Cell {point.Nearest.Cell.CellId} of '{slug}' has no step{WindowText(window)}; widen the window."));
        return (new PointAnalysis(point, window, result, periods, await provenance.ForAsync(point.Dataset, cancel), spectral, atOutputPoint), null);
    }

    /// <summary>The answer of <c>GET /point</c> in JSON, with the asked parts.</summary>
    public static PointStatistics Statistics(PointAnalysis analysis, IReadOnlySet<string> parts)
    {
        var (point, window, result) = (analysis.Point, analysis.Window, analysis.Result);
        var units = WaveParameterNames.All.ToDictionary(p => p.Symbol(), p => p.Unit());
        var annual = result.Find(AtlasPeriod.Annual);
        return new PointStatistics(
            point.Dataset.Slug, point.Cell, new PointWindow(window.FromYear, window.ToYear, window.Months), result.StepsInWindow, result.DeepWaterAssumed,
            result.EnergyPeriodSource, result.QuantileDefinition, units, analysis.Periods,
            parts.Contains("exceedance") ? new PointExceedance(result.HsExceedance, result.PowerExceedance) : null,
            parts.Contains("joint") ? result.JointOccurrence : null,
            parts.Contains("rose") && annual is not null ? RoseOf(annual.Direction) : null,
            parts.Contains("interannual") ? result.InterAnnual : null,
            analysis.Source, AtlasCaution.Text)
        {
            PowerFrom = analysis.AtOutputPoint ? "spectra" : "Hs and Te",
            Spectral = parts.Contains("spectra") ? analysis.Spectral : analysis.Spectral?.WithoutSpectra(),
        };
    }

    private static PowerRose RoseOf(DirectionStatistics direction) => new(
        DirectionStatistics.Sectors, DirectionStatistics.SectorWidthDegrees,
        Enumerable.Range(0, DirectionStatistics.Sectors).Select(k => k * DirectionStatistics.SectorWidthDegrees).ToArray(),
        direction.PowerRose);

    /// <summary>" in the window 2019-2020 months 1,2", or nothing for the whole record.</summary>
    public static string WindowText(YearWindow w) =>
        w.FromYear is null && w.ToYear is null && w.Months is null ? "" : $" in the window {w.FromYear?.ToString(CultureInfo.InvariantCulture) ?? "..."}-{w.ToYear?.ToString(CultureInfo.InvariantCulture) ?? "..."}" + (w.Months is { } m ? $" months {string.Join(',', m)}" : "");
}
