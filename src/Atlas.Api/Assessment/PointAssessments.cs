using Atlas.WavePhysics;

namespace Atlas.Api.Assessment;

/// <summary>A located point with its series over the asked years, and its Hs on regular steps (every analysis uses them).</summary>
public sealed record PointContext(LocatedPoint Point, PointCell Cell, PointSeries Series, YearWindow Window, RegularSeries Hs);

/// <summary>
/// Device production, weather windows and extreme Hs from the exact series of the wet cell nearest a position: the one
/// computation behind <c>/point/yield</c>, <c>/point/windows</c>, <c>/point/extremes</c>, the site report and
/// <c>atlas report</c>. Each answer is the response the endpoint serialises, or the problem that prevents it.
/// </summary>
public sealed class PointAssessments(PointLocator locator, DatasetCatalog catalog, SeriesStore series, NpgsqlDataSource dataSource,
    ProvenanceBuilder provenance)
{
    /// <summary>The point located and its series read over the window's years, or the problem (unknown dataset, too far, too little series).</summary>
    public async Task<(PointContext? Context, ProblemHttpResult? Problem)> ReadAsync(string slug, (double Latitude, double Longitude) position,
        YearWindow window, CancellationToken cancel)
    {
        var (point, problem) = await locator.LocateAsync(slug, position.Latitude, position.Longitude, cancel);
        if (point is null) return (null, problem);
        return await ReadAsync(point, window, cancel);
    }

    /// <summary>The series of a point already located, over the window's years.</summary>
    public async Task<(PointContext? Context, ProblemHttpResult? Problem)> ReadAsync(LocatedPoint point, YearWindow window, CancellationToken cancel)
    {
        var slug = point.Dataset.Slug;
        var timelines = await catalog.TimelinesAsync(point.Dataset, cancel);
        var decoded = await AssessmentSeries.ReadAsync(series, timelines, point.Dataset.Id, point.Nearest.Cell, window.FromYear, window.ToYear, cancel);
        if (decoded.Times.Length < 2)
            return (null, ApiProblems.Unprocessable("Too little series in the window",
                $"Cell {point.Nearest.Cell.CellId} of '{slug}' has {decoded.Times.Length} stored step(s) in the years asked; stored years are " +
                $"{(timelines.Count == 0 ? "none" : $"{timelines.Keys.First()}..{timelines.Keys.Last()}")}."));
        var (hs, irregular) = Regular(slug, decoded, decoded.Hs);
        return hs is null ? (null, irregular) : (new PointContext(point, point.Cell, decoded, window, hs), null);
    }

    /// <summary>The stored device of that name or slug, or the 404 problem naming it.</summary>
    public async Task<(StoredDeviceMatrix? Device, ProblemHttpResult? Problem)> FindDeviceAsync(string device, CancellationToken cancel) =>
        await new DeviceStore(dataSource).FindAsync(device, cancel) is { } stored ? (stored, null) : (null, ApiProblems.UnknownDevice(device));

    /// <summary>The device's production at the point.</summary>
    public async Task<(PointYield? Yield, ProblemHttpResult? Problem)> YieldAsync(PointContext context, StoredDeviceMatrix stored,
        PowerMatrixInterpolation reading, CancellationToken cancel)
    {
        var slug = context.Point.Dataset.Slug;
        var (period, periodSource) = PeriodFor(stored.AxisKind, context.Series);
        if (period is null) return (null, ApiProblems.Unprocessable("No wave period stored", $"Dataset '{slug}' stores neither Te nor Tp, so no device production can be computed."));
        var (regularPeriod, _) = Regular(context, period);
        var matrix = DeviceMatrices.ToPowerMatrix(stored);
        var result = DeviceYield.FromSeries(matrix, context.Hs, regularPeriod!, matrix.PeriodKind, new YieldOptions { Interpolation = reading });
        var summary = new DeviceSummary(stored.Name, stored.Slug, DeviceStore.AxisName(stored.AxisKind), stored.RatedPowerKw);
        return (PointYield.From(slug, context.Cell, summary, periodSource, context.Window.FromYear, context.Window.ToYear, result,
            await provenance.ForAsync(context.Point.Dataset, cancel)), null);
    }

    /// <summary>Weather windows for the access limits and the duration an operation needs.</summary>
    public async Task<(PointWindows? Windows, ProblemHttpResult? Problem)> WindowsAsync(PointContext context, AccessLimits limits, double durationHours,
        CancellationToken cancel)
    {
        var slug = context.Point.Dataset.Slug;
        if (limits.TpLimitSeconds is not null && !context.Series.HasTp)
            return (null, ApiProblems.Unprocessable("No Tp stored", $"Dataset '{slug}' stores no peak period, so a Tp limit cannot be applied; leave tp_max out."));
        var tp = limits.TpLimitSeconds is null ? null : Regular(context, context.Series.Tp).Series;
        var result = WeatherWindowAnalysis.Analyse(context.Hs, tp, limits, durationHours);
        return (PointWindows.From(slug, context.Cell, context.Window.FromYear, context.Window.ToYear, result,
            await provenance.ForAsync(context.Point.Dataset, cancel)), null);
    }

    /// <summary>Extreme Hs by annual maxima, peaks over threshold, or both (<paramref name="method"/> null).</summary>
    public async Task<(PointExtremes? Extremes, ProblemHttpResult? Problem)> ExtremesAsync(PointContext context, string? method,
        PeaksOverThresholdOptions pot, CancellationToken cancel)
    {
        var hs = context.Hs;
        AnnualMaximaExtremes? annual = null;
        PeaksOverThresholdExtremes? peaks = null;
        if (method is null or PointExtremesQuery.AnnualMaxima)
        {
            annual = AnnualMaximaOf(hs);
            if (!annual.Available && method is not null) return (null, ApiProblems.Unprocessable("Annual maxima cannot be fitted", annual.Reason!));
        }
        if (method is null or PointExtremesQuery.PeaksOverThreshold)
        {
            peaks = PeaksOf(hs, pot);
            if (!peaks.Available && method is not null) return (null, ApiProblems.Unprocessable("Peaks over threshold cannot be fitted", peaks.Reason!));
        }
        var valid = 0;
        foreach (var v in hs.Values) if (!double.IsNaN(v)) valid++;
        var recordYears = valid * hs.StepHours / CalendarHours.PerMeanYear;
        var cautions = (annual?.Cautions ?? []).Concat(peaks?.Cautions ?? []).ToArray();
        var strong = cautions.Where(c => c.Kind is "long_extrapolation").Concat(cautions.Where(c => c.Kind is "small_sample")).Select(c => c.Text).Distinct().ToArray();
        return (new PointExtremes(context.Point.Dataset.Slug, context.Cell, "hs", "m", recordYears, context.Window.FromYear, context.Window.ToYear, annual, peaks,
            strong.Length == 0 ? null : string.Join(" ", strong), await provenance.ForAsync(context.Point.Dataset, cancel), AtlasCaution.Text), null);
    }

    /// <summary>The values on regular steps, or the problem when the dataset's time line has no common step.</summary>
    private static (RegularSeries? Series, ProblemHttpResult? Problem) Regular(PointContext context, float[] values) =>
        Regular(context.Point.Dataset.Slug, context.Series, values);

    private static (RegularSeries? Series, ProblemHttpResult? Problem) Regular(string slug, PointSeries series, float[] values)
    {
        try
        {
            return (AssessmentSeries.Regular(series.Times, values), null);
        }
        catch (ArgumentException e)
        {
            return (null, ApiProblems.Unprocessable("The time line is not regular",
                $"The analyses need steps on a common interval, but the time line of '{slug}' is not: {e.Message.Split(" (Parameter")[0]}"));
        }
    }

    /// <summary>
    /// The period series a matrix needs: the stored one, or converted from the other period for a JONSWAP spectrum with
    /// gamma 3.3 (Te = 0.9 Tp), as the statistics do; null when the dataset stores neither.
    /// </summary>
    public static (float[]? Period, string Source) PeriodFor(DeviceAxisKind axis, PointSeries s)
    {
        if (axis == DeviceAxisKind.Te)
        {
            if (s.HasTe) return (s.Te, "te as stored");
            if (!s.HasTp) return (null, "");
            var te = new float[s.Tp.Length];
            PeriodConversion.EnergyPeriodFromPeakPeriod(s.Tp, te, SpectrumShape.JonswapGamma33);
            return (te, "te derived as 0.9 tp (JONSWAP gamma 3.3): the dataset stores no energy period");
        }
        if (s.HasTp) return (s.Tp, "tp as stored");
        if (!s.HasTe) return (null, "");
        var tp = new float[s.Te.Length];
        for (var i = 0; i < tp.Length; i++) tp[i] = (float)PeriodConversion.PeakPeriodFromEnergyPeriod(s.Te[i], SpectrumShape.JonswapGamma33);
        return (tp, "tp derived as te / 0.9 (JONSWAP gamma 3.3): the dataset stores no peak period");
    }

    private static AnnualMaximaExtremes AnnualMaximaOf(RegularSeries hs)
    {
        var sample = AnnualMaxima.Extract(hs);
        var maxima = sample.Maxima.Select(m => new AnnualMaximumRow(m.Year, m.Value, DateTime.UnixEpoch.AddSeconds(m.TimeUnixSeconds), m.Coverage)).ToArray();
        var rejected = sample.RejectedYears.Select(r => new RejectedYearRow(r.Year, r.Coverage)).ToArray();
        if (sample.Maxima.Count < GevMaximumLikelihood.MinimumSampleSize)
            return new AnnualMaximaExtremes(false,
                $"Only {sample.Maxima.Count} calendar year(s) have at least {sample.MinimumCoverage:P0} coverage; an annual-maxima fit needs " +
                $"{GevMaximumLikelihood.MinimumSampleSize}. Use peaks over threshold for a short record.",
                sample.MinimumCoverage, maxima, rejected, null, null, []);
        var result = AnnualMaximaAnalysis.Run(sample);
        return new AnnualMaximaExtremes(true, null, sample.MinimumCoverage, maxima, rejected,
            Fit("gumbel", result.Gumbel, result.GumbelReturnLevels, result.GumbelDiagnostics),
            Fit("gev", result.Gev, result.GevReturnLevels, result.GevDiagnostics),
            [.. result.Cautions.Select(CautionRow.From)]);
    }

    private static DistributionFit Fit(string name, GevFit fit, IReadOnlyList<ReturnLevel> levels, IReadOnlyList<ProbabilityPlotPoint> diagnostics) =>
        new(name, fit.Distribution.Location, fit.Distribution.Scale, fit.Distribution.Shape, fit.Distribution.ScipyShapeC, fit.LogLikelihood,
            [.. levels.Select(ReturnLevelRow.From)], [.. diagnostics.Select(PlotPointRow.From)]);

    private static PeaksOverThresholdExtremes PeaksOf(RegularSeries hs, PeaksOverThresholdOptions options)
    {
        PeaksOverThresholdResult result;
        try
        {
            result = PeaksOverThresholdAnalysis.Run(hs, options);
        }
        catch (ArgumentException e)
        {
            return new PeaksOverThresholdExtremes(false, e.Message.Split(" (Parameter")[0], null, null, options.SeparationHours, null, null, [], null, []);
        }
        var fit = result.Fit;
        return new PeaksOverThresholdExtremes(true, null, result.Threshold, SkillRow.Finite(result.ThresholdQuantile), result.SeparationHours, result.RecordYears,
            result.ExceedancesPerYear,
            [.. result.Peaks.Select(p => new StormPeakRow(At(p.StartUnixSeconds), At(p.EndUnixSeconds), At(p.PeakUnixSeconds), p.PeakValue, p.StepsAboveThreshold))],
            new DistributionFit("gpd", null, fit.Distribution.Scale, fit.Distribution.Shape, null, fit.LogLikelihood,
                [.. result.ReturnLevels.Select(ReturnLevelRow.From)], [.. result.Diagnostics.Select(PlotPointRow.From)]),
            [.. result.Cautions.Select(CautionRow.From)]);
    }

    private static DateTime At(long unixSeconds) => DateTime.UnixEpoch.AddSeconds(unixSeconds);
}
