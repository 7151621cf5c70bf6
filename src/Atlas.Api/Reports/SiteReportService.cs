using Atlas.Hindcast.Geodesy;

namespace Atlas.Api.Reports;

/// <summary>
/// Gathers and writes a site report through the services the point endpoints use (so its numbers are the API's), for
/// <c>GET /point/report.pdf</c> and <c>atlas report</c> alike. Bad input gives the problem the endpoints give, before
/// anything is written.
/// </summary>
public sealed class SiteReportService(PointLocator locator, DatasetCatalog catalog, PointStatisticsService statistics, PointAssessments assessments,
    ValidationService validation, DryCellLand land, CellFootprints footprints, StatisticsOptions statisticsOptions, OutputPointRecords outputPointRecords)
{
    /// <summary>The report's content, or the problem (unknown dataset or device, a position off the sea cells, no steps in the window).</summary>
    public async Task<(SiteReportContent? Content, ProblemHttpResult? Problem)> GatherAsync(SiteReportRequest request, CancellationToken cancel)
    {
        var (point, problem) = await locator.LocateAsync(request.Slug, request.Latitude, request.Longitude, cancel);
        if (point is null) return (null, problem);
        StoredDeviceMatrix? device = null;
        if (request.Device is { } name)
        {
            (device, problem) = await assessments.FindDeviceAsync(name, cancel);
            if (device is null) return (null, problem);
        }
        var (analysis, noSteps) = await statistics.AnalyseAsync(point, request.Window, null, cancel);
        if (analysis is null) return (null, noSteps);
        var pointStatistics = PointStatisticsService.Statistics(analysis, PointStatisticsQuery.Parts.ToHashSet());

        // Windows, extremes and yield read whole years, as their endpoints do (they take from and to, not months).
        var years = request.Window with { Months = null };
        var (context, tooLittle) = await assessments.ReadAsync(point, years, cancel);
        if (context is null) return (null, tooLittle);
        var (windows, windowProblem) = await assessments.WindowsAsync(context, new AccessLimits(request.HsLimitMetres, null), request.WindowHours, cancel);
        if (windows is null) return (null, windowProblem);
        var (extremes, extremeProblem) = await assessments.ExtremesAsync(context, null, new PeaksOverThresholdOptions(), cancel);
        if (extremes is null) return (null, extremeProblem);
        PointYield? yield = null;
        if (device is not null)
        {
            (yield, problem) = await assessments.YieldAsync(context, device, PowerMatrixInterpolation.Bilinear, cancel);
            if (yield is null) return (null, problem);
        }

        // Power per step as the series endpoint derives it (Te from Tp for the assumed spectrum where Te is not stored);
        // at an output point, the power integrated from its spectra, as its statistics use.
        var (_, power, _) = context.Series.Derived(statisticsOptions.AssumedSpectrum);
        double[] j = [.. power.Select(v => (double)v)];
        if (analysis.AtOutputPoint && await outputPointRecords.ForAsync(point.Dataset, point.Nearest.Cell, cancel) is { } record)
            SpectralPower(record, years, context.Series.Times, j);
        var series = new PointTimeSeries(context.Series.Times, [.. context.Series.Hs.Select(v => (double)v)], j);
        var dryCells = await land.ForAsync(point.Dataset, cancel);
        var extent = GridOutline.Of((await footprints.ForAsync(point.Dataset, cancel)).Values, dryCells, (await catalog.ExtentAsync(point.Dataset, cancel))!.Value);
        return (new SiteReportContent(request, pointStatistics, windows, extremes, yield, series, await NearestStationAsync(point, cancel),
            dryCells, extent, pointStatistics.Provenance.GeneratedAtUtc), null);
    }

    /// <summary>Puts the output point's spectral power of the window's years into <paramref name="power"/> (the steps a read
    /// of those years' chunks decodes to, as <paramref name="times"/> are).</summary>
    private static void SpectralPower(OutputPointRecord record, YearWindow years, ReadOnlySpan<long> times, double[] power)
    {
        var range = record.StepsOf(years.FromYear, years.ToYear);
        if (!record.Series.Times.AsSpan(range).SequenceEqual(times)) return;
        var spectral = record.Steps[SpectralProduct.Power].AsSpan(range);
        for (int k = 0; k < spectral.Length; k++) power[k] = spectral[k];
    }

    /// <summary>The PDF of gathered content.</summary>
    public static byte[] Write(SiteReportContent content) => SiteReportLayout.Write(content);

    /// <summary>The station nearest the report's cell that the dataset covers (none when no station is registered or covered).</summary>
    private async Task<NearestStationSkill?> NearestStationAsync(LocatedPoint point, CancellationToken cancel)
    {
        var cell = point.Nearest.Cell;
        var stations = (await validation.Stations.ListAsync(cancel))
            .Select(s => (Station: s, Metres: GeodesicDistance.Metres(cell.Latitude, cell.Longitude, s.Latitude, s.Longitude)))
            .OrderBy(s => s.Metres);
        foreach (var (station, metres) in stations)
        {
            var (validated, _) = await validation.AtStationAsync(point.Dataset, station, cancel);
            if (validated is null) continue;
            var skill = ValidationReporting.Skill(validated);
            var hs = validated.Find(WaveParameter.Hs);
            ValidationPlotSeries? pairs = null;
            if (hs is { Scalar: { } scalar })
            {
                var p = hs.Pairs;
                var observed = new double[p.Count];
                var modelled = new double[p.Count];
                for (var i = 0; i < p.Count; i++) (observed[i], modelled[i]) = (p.Observed[i], p.Modelled[i]);
                var times = new long[p.Count];
                for (var i = 0; i < p.Count; i++) times[i] = p.TimesUnixSeconds[i];
                pairs = new ValidationPlotSeries(times, observed, modelled,
                    [.. scalar.Quantiles.Select(q => q.ObservedQuantile)], [.. scalar.Quantiles.Select(q => q.ModelledQuantile)]);
            }
            return new NearestStationSkill(skill, metres, pairs);
        }
        return null;
    }
}
