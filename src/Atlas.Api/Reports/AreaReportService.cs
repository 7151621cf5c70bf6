namespace Atlas.Api.Reports;

/// <summary>
/// Gathers and writes an area report through <see cref="AreaStatisticsService"/> (the service of <c>POST /area</c>)
/// and the screening query of <c>GET /screen</c>, so that its numbers are theirs.
/// </summary>
public sealed class AreaReportService(AreaStatisticsService areas, ScreeningQueries screening, CellFootprints footprints, DatasetCatalog catalog,
    DryCellLand land, StatisticsOptions statisticsOptions)
{
    /// <summary>The report's content for the polygon in <paramref name="body"/>, or the problem the area endpoint would give.</summary>
    public async Task<(AreaReportContent? Content, ProblemHttpResult? Problem)> GatherAsync(string slug, byte[] body, WaveParameter parameter,
        StatisticKind statistic, AtlasPeriod period, double? threshold, ScreeningBounds criteria, CancellationToken cancel)
    {
        var (selection, problem) = await areas.SelectAsync(slug, body, cancel);
        if (selection is null) return (null, problem);
        var dataset = selection.Dataset;
        var values = await areas.LayerAsync(dataset, parameter, statistic, period, cancel);
        var statistics = await areas.StatisticsAsync(selection, parameter, statistic, period, threshold, values, cancel);

        var shares = new List<AreaThresholdShare>();
        foreach (var level in Thresholds(parameter, statistics, threshold))
        {
            var above = await areas.StatisticsAsync(selection, parameter, statistic, period, level, values, cancel);
            shares.Add(new AreaThresholdShare(level, above.CellsAboveThreshold ?? 0, above.AreaAboveThresholdKm2 ?? 0,
                statistics.CellAreaKm2 > 0 ? (above.AreaAboveThresholdKm2 ?? 0) / statistics.CellAreaKm2 : double.NaN));
        }

        var matching = await screening.MatchingCellsAsync(dataset.Id, new ScreeningCriteria(criteria.Period, criteria.MinPowerKwM, criteria.MinDepthM,
            criteria.MaxDepthM, criteria.MaxCoastDistanceKm * 1000, criteria.MaxHsP90M), cancel);
        var insideIds = selection.Inside.ToDictionary(c => c.CellId);
        var met = matching.Where(c => insideIds.ContainsKey(c.CellId)).Select(c => insideIds[c.CellId]).ToArray();
        var metKm2 = met.Sum(c => c.SquareKilometres);
        var screened = new AreaScreening(criteria, selection.Inside.Count, met.Length, metKm2, statistics.CellAreaKm2 > 0 ? metKm2 / statistics.CellAreaKm2 : double.NaN);

        var dryCells = await land.ForAsync(dataset, cancel);
        var allCells = await footprints.ForAsync(dataset, cancel);
        var extent = GridOutline.Of(allCells.Values, dryCells, (await catalog.ExtentAsync(dataset, cancel))!.Value);
        var view = View(selection.Area.EnvelopeInternal, extent);
        var cells = allCells.Values
            .Where(c => values.ContainsKey(c.CellId) && c.Longitude >= view.West - 1 && c.Longitude <= view.East + 1 && c.Latitude >= view.South - 1 && c.Latitude <= view.North + 1)
            .Select(c => (c.Polygon, values[c.CellId])).ToArray();
        return (new AreaReportContent(statistics, shares, screened, selection.Area, cells, dryCells, extent, view,
            statistics.Provenance.GeneratedAtUtc), null);
    }

    /// <summary>The PDF of gathered content.</summary>
    public static byte[] Write(AreaReportContent content) => AreaReportLayout.Write(content);

    /// <summary>
    /// The thresholds the shares are given for: the statistics options' power or Hs thresholds for a mean of j or hs,
    /// otherwise round steps across the area's range; the asked threshold always among them.
    /// </summary>
    private IReadOnlyList<double> Thresholds(WaveParameter parameter, AreaStatistics statistics, double? asked)
    {
        IEnumerable<double> levels = parameter switch
        {
            WaveParameter.J when statistics.Layer.Statistic is "mean" or "p50" or "p90" => statisticsOptions.PowerThresholdsKilowattsPerMetre,
            WaveParameter.Hs when statistics.Layer.Statistic is "mean" or "p50" or "p90" => statisticsOptions.HsThresholdsMetres,
            _ when statistics.Min is { } low && statistics.Max is { } high && high > low => Steps(low, high),
            _ => [],
        };
        return levels.Concat(asked is { } a ? [a] : []).Distinct().Order().ToArray();
    }

    private static IEnumerable<double> Steps(double low, double high)
    {
        var step = ReportNumbers.NiceStep((high - low) / 4);
        for (var level = Math.Floor(low / step) * step; level < high; level += step) yield return level;
    }

    /// <summary>The polygon's envelope widened by its own size on each side, within the grid's extent (never smaller than a twentieth of it).</summary>
    private static (double West, double South, double East, double North) View(Envelope area, (double West, double South, double East, double North) extent)
    {
        var width = Math.Max(area.Width, (extent.East - extent.West) / 20);
        var height = Math.Max(area.Height, (extent.North - extent.South) / 20);
        return (Math.Max(extent.West, area.MinX - width), Math.Max(extent.South, area.MinY - height),
            Math.Min(extent.East, area.MaxX + width), Math.Min(extent.North, area.MaxY + height));
    }
}
