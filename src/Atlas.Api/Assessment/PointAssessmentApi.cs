using Atlas.WavePhysics;

namespace Atlas.Api.Assessment;

/// <summary>
/// <c>/api/v1/datasets/{slug}/point/yield</c>, <c>/point/windows</c>, <c>/point/extremes</c>: device production, weather
/// windows and extreme Hs from the exact series of the wet cell nearest a position.
/// </summary>
public static class PointAssessmentApi
{
    public static IEndpointRouteBuilder MapPointAssessmentApi(this IEndpointRouteBuilder routes)
    {
        var group = routes.MapGroup("/api/v1/datasets/{slug}/point").WithTags("Points");
        group.MapGet("/yield", YieldAsync)
            .ProducesProblems(StatusCodes.Status404NotFound, StatusCodes.Status422UnprocessableEntity)
            .RequireExpensiveLimit();
        group.MapGet("/windows", WindowsAsync)
            .ProducesProblems(StatusCodes.Status404NotFound, StatusCodes.Status422UnprocessableEntity)
            .RequireExpensiveLimit();
        group.MapGet("/extremes", ExtremesAsync)
            .ProducesProblems(StatusCodes.Status404NotFound, StatusCodes.Status422UnprocessableEntity)
            .RequireExpensiveLimit();
        return routes;
    }

    /// <summary>A located point with its series over the asked years, and its Hs on regular steps (every analysis uses them).</summary>
    private sealed record PointContext(LocatedPoint Point, PointCell Cell, PointSeries Series, YearWindow Window, RegularSeries Hs);

    private static async Task<(PointContext? Context, ProblemHttpResult? Problem)> ReadAsync(string slug, (double Latitude, double Longitude) position,
        YearWindow window, PointLocator locator, DatasetCatalog catalog, SeriesStore series, CancellationToken cancel)
    {
        var (point, problem) = await locator.LocateAsync(slug, position.Latitude, position.Longitude, cancel);
        if (point is null) return (null, problem);
        var timelines = await catalog.TimelinesAsync(point.Dataset, cancel);
        var decoded = await AssessmentSeries.ReadAsync(series, timelines, point.Dataset.Id, point.Nearest.Cell, window.FromYear, window.ToYear, cancel);
        if (decoded.Times.Length < 2)
            return (null, ApiProblems.Unprocessable("Too little series in the window",
                $"Cell {point.Nearest.Cell.CellId} of '{slug}' has {decoded.Times.Length} stored step(s) in the years asked; stored years are " +
                $"{(timelines.Count == 0 ? "none" : $"{timelines.Keys.First()}..{timelines.Keys.Last()}")}."));
        var (hs, irregular) = Regular(slug, decoded, decoded.Hs);
        return hs is null ? (null, irregular) : (new PointContext(point, point.Cell, decoded, window, hs), null);
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

    [EndpointName("PointYield")]
    [EndpointSummary("A device's energy production at the wet cell nearest a position")]
    [EndpointDescription(
        "lat, lon: degrees. device: a stored device's name or slug. interpolation: bilinear (default) or nearest. from, to: calendar years " +
        "(inclusive). Mean annual energy (MWh/yr), capacity factor, production per calendar month and per year with the inter-annual " +
        "coefficient of variation, and the share of time the sea state lies outside the matrix (counted at 0 kW).")]
    public static async Task<Results<Ok<PointYield>, ProblemHttpResult, ValidationProblem>> YieldAsync(
        string slug, [AsParameters] PointPosition at, [AsParameters] PointYieldQuery query,
        PointLocator locator, DatasetCatalog catalog, SeriesStore series, NpgsqlDataSource dataSource, ProvenanceBuilder provenance, CancellationToken cancel)
    {
        var errors = new QueryErrors();
        var position = at.Position(errors);
        var window = at.Window(errors);
        var device = query.DeviceName(errors);
        var reading = MatrixInterpolationQuery.Read(query.Interpolation, errors);
        if (errors.Count > 0 || position is null || window is null) return TypedResults.ValidationProblem(errors, title: "The yield request has invalid query values");

        if (await new DeviceStore(dataSource).FindAsync(device!, cancel) is not { } stored) return ApiProblems.UnknownDevice(device!);
        var (context, problem) = await ReadAsync(slug, position.Value, window, locator, catalog, series, cancel);
        if (context is null) return problem!;
        var (period, periodSource) = PeriodFor(stored.AxisKind, context.Series);
        if (period is null) return ApiProblems.Unprocessable("No wave period stored", $"Dataset '{slug}' stores neither Te nor Tp, so no device production can be computed.");
        var (regularPeriod, _) = Regular(context, period);
        var matrix = DeviceMatrices.ToPowerMatrix(stored);
        var result = DeviceYield.FromSeries(matrix, context.Hs, regularPeriod!, matrix.PeriodKind, new YieldOptions { Interpolation = reading });
        var summary = new DeviceSummary(stored.Name, stored.Slug, DeviceStore.AxisName(stored.AxisKind), stored.RatedPowerKw);
        return TypedResults.Ok(PointYield.From(slug, context.Cell, summary, periodSource, window.FromYear, window.ToYear, result,
            await provenance.ForAsync(context.Point.Dataset, cancel)));
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

    [EndpointName("PointWindows")]
    [EndpointSummary("Weather windows for access limits at the wet cell nearest a position")]
    [EndpointDescription(
        "lat, lon: degrees. hs_max: the Hs limit, m. tp_max (optional): the Tp limit, s. hours: the duration an operation needs. from, to: " +
        "calendar years. Per calendar month: the probability that a window starts at a random time, the mean number of windows, the mean " +
        "waiting time for the next window start; calm and storm spell persistence; the share of time within limits.")]
    public static async Task<Results<Ok<PointWindows>, ProblemHttpResult, ValidationProblem>> WindowsAsync(
        string slug, [AsParameters] PointPosition at, [AsParameters] AccessLimitsQuery query,
        PointLocator locator, DatasetCatalog catalog, SeriesStore series, ProvenanceBuilder provenance, CancellationToken cancel)
    {
        var errors = new QueryErrors();
        var position = at.Position(errors);
        var window = at.Window(errors);
        var limits = query.Limits(errors);
        var duration = query.Duration("the duration the operation needs, in hours", errors, required: true);
        if (errors.Count > 0 || position is null || window is null || limits is null || duration is null)
            return TypedResults.ValidationProblem(errors, title: "The windows request has invalid query values");

        var (context, problem) = await ReadAsync(slug, position.Value, window, locator, catalog, series, cancel);
        if (context is null) return problem!;
        if (limits.TpLimitSeconds is not null && !context.Series.HasTp)
            return ApiProblems.Unprocessable("No Tp stored", $"Dataset '{slug}' stores no peak period, so a Tp limit cannot be applied; leave tp_max out.");
        var hs = context.Hs;
        var tp = limits.TpLimitSeconds is null ? null : Regular(context, context.Series.Tp).Series;
        var result = WeatherWindowAnalysis.Analyse(hs, tp, limits, duration.Value);
        return TypedResults.Ok(PointWindows.From(slug, context.Cell, window.FromYear, window.ToYear, result, await provenance.ForAsync(context.Point.Dataset, cancel)));
    }

    [EndpointName("PointExtremes")]
    [EndpointSummary("Extreme Hs return levels at the wet cell nearest a position")]
    [EndpointDescription(
        "lat, lon: degrees. method: annual-maxima (Gumbel and GEV by maximum likelihood), peaks-over-threshold (GPD on runs-declustered " +
        "storm peaks), or both when left out. threshold (m) or threshold_quantile (default 0.99) and separation_hours (default 48) for " +
        "peaks over threshold. Return levels for 1, 5, 10, 50 and 100 years with 95 % profile-likelihood intervals, the fit against the " +
        "data (probability-plot points) and cautions, strongest first in strong_caution when the record is short for the return period.")]
    public static async Task<Results<Ok<PointExtremes>, ProblemHttpResult, ValidationProblem>> ExtremesAsync(
        string slug, [AsParameters] PointPosition at, [AsParameters] PointExtremesQuery query,
        PointLocator locator, DatasetCatalog catalog, SeriesStore series, ProvenanceBuilder provenance, CancellationToken cancel)
    {
        var errors = new QueryErrors();
        var position = at.Position(errors);
        var window = at.Window(errors);
        var method = query.OneMethod(errors);
        var pot = query.PeaksOptions(errors);
        if (errors.Count > 0 || position is null || window is null) return TypedResults.ValidationProblem(errors, title: "The extremes request has invalid query values");

        var (context, problem) = await ReadAsync(slug, position.Value, window, locator, catalog, series, cancel);
        if (context is null) return problem!;
        var hs = context.Hs;

        AnnualMaximaExtremes? annual = null;
        PeaksOverThresholdExtremes? peaks = null;
        if (method is null or PointExtremesQuery.AnnualMaxima)
        {
            annual = AnnualMaximaOf(hs);
            if (!annual.Available && method is not null) return ApiProblems.Unprocessable("Annual maxima cannot be fitted", annual.Reason!);
        }
        if (method is null or PointExtremesQuery.PeaksOverThreshold)
        {
            peaks = PeaksOf(hs, pot);
            if (!peaks.Available && method is not null) return ApiProblems.Unprocessable("Peaks over threshold cannot be fitted", peaks.Reason!);
        }
        var valid = 0;
        foreach (var v in hs.Values) if (!double.IsNaN(v)) valid++;
        var recordYears = valid * hs.StepHours / CalendarHours.PerMeanYear;
        var cautions = (annual?.Cautions ?? []).Concat(peaks?.Cautions ?? []).ToArray();
        var strong = cautions.Where(c => c.Kind is "long_extrapolation").Concat(cautions.Where(c => c.Kind is "small_sample")).Select(c => c.Text).Distinct().ToArray();
        return TypedResults.Ok(new PointExtremes(slug, context.Cell, "hs", "m", recordYears, window.FromYear, window.ToYear, annual, peaks,
            strong.Length == 0 ? null : string.Join(" ", strong), await provenance.ForAsync(context.Point.Dataset, cancel), AtlasCaution.Text));
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
