using Microsoft.AspNetCore.Http.Json;

namespace Atlas.Api.Apis;

/// <summary><c>GET /api/v1/datasets/{slug}/point</c>: exact statistics from the stored series of the nearest wet cell.</summary>
public static class PointStatisticsApi
{
    public static RouteHandlerBuilder MapPointStatistics(this RouteGroupBuilder group) =>
        group.MapGet("/point", PointAsync)
            .WithDescription(Description(((IEndpointRouteBuilder)group).ServiceProvider.GetRequiredService<StatisticsOptions>().LowCoverageThreshold))
            .Produces<PointStatistics>(StatusCodes.Status200OK, "application/json", "text/csv")
            .Produces(StatusCodes.Status304NotModified)
            .ProducesProblems(StatusCodes.Status404NotFound, StatusCodes.Status422UnprocessableEntity)
            .RequireExpensiveLimit();

    /// <summary>The endpoint's description, with the coverage threshold the server is configured with.</summary>
    private static string Description(double lowCoverageThreshold) =>
        "lat, lon: degrees. period: one of jan..dec, djf, mam, jja, son, annual, y2019, or all (default). from, to: calendar " +
            "years (inclusive) and months: calendar months 1..12 (comma separated) restrict the series used; the annual period is " +
            "then the whole window. include: comma-separated parts among exceedance (Hs and J exceedance curves over the window), " +
            "joint (Hm0 x Te occurrence, 0.5 m x 1 s bins, with mean power and share of energy per bin), rose (16-sector power rose), " +
            "interannual (yearly annual and seasonal means and coefficients of variation); all by default, none for summaries only. " +
            "Statistics are computed exactly from the stored series (percentiles Hyndman-Fan type 7); the cell (id, lat, lon, depth_m, " +
            "distance_m) is the nearest wet cell. Coverage: " + MethodNotes.Coverage(lowCoverageThreshold) + ". " +
            "Seasons and the annual period: " + MethodNotes.Climatology + "; weighted percentiles: " + MethodNotes.WeightedPercentiles + ". " +
            "Inter-annual: " + MethodNotes.Seasons + "; " + MethodNotes.InterAnnual + ". Each period's direction block carries " +
            "directionality_coefficient and max_power_from_deg: " + MethodNotes.Directionality + ". The cell (id, lat, lon, depth_m, " +
            "distance_m) is the nearest wet cell, refused (422) beyond the distance limit or outside the extent. " +
            "format=csv gives the period table after '#' lines of provenance, units and the caution.";

    [EndpointName("PointStatistics")]
    [EndpointSummary("Exact statistics of every parameter at the wet cell nearest a position")]
    public static async Task<Results<FileContentHttpResult, StatusCodeHttpResult, ProblemHttpResult, ValidationProblem>> PointAsync(
        string slug, [AsParameters] PointPosition at, [AsParameters] PointStatisticsQuery query,
        PointLocator locator, DatasetCatalog catalog, SeriesStore series, ProvenanceBuilder provenance, PointResponseCache responses,
        PointCalendars calendars, StatisticsOptions statisticsOptions, StationSpectraAnswers stationSpectra, OutputPoints outputPoints,
        IOptions<JsonOptions> json, HttpContext http, CancellationToken cancel)
    {
        var errors = new QueryErrors();
        var position = at.Position(errors);
        var window = at.Window(errors, query.Months);
        var onlyPeriod = query.OnePeriod(errors);
        var parts = query.IncludedParts(errors);
        var csv = query.Csv(errors);
        if (errors.Count > 0 || position is null || window is null || parts is null)
            return TypedResults.ValidationProblem(errors, title: "The point request has invalid query values");

        var (point, problem) = await locator.LocateAsync(slug, position.Value.Latitude, position.Value.Longitude, cancel);
        if (point is null) return problem!;
        var nearestPoint = await outputPoints.NearestAsync(point.Dataset, position.Value.Latitude, position.Value.Longitude, cancel);
        var key = await ResponseKeyAsync(point, position.Value, window, onlyPeriod, parts, csv, catalog, nearestPoint?.Dataset, cancel);
        var spectral = new SpectralContext(stationSpectra, nearestPoint, position.Value);
        // Computed without the request's cancellation: other requests for the same key may be waiting on it.
        var (response, failure) = await responses.GetOrComputeAsync(key,
            () => ComputeAsync(point, window, onlyPeriod, parts, csv, catalog, series, provenance, calendars, statisticsOptions, spectral,
                json.Value.SerializerOptions, CancellationToken.None));
        return response is null ? failure! : Respond(response, http);
    }

    private static async Task<PointOutcome> ComputeAsync(LocatedPoint point, YearWindow window, AtlasPeriod? onlyPeriod, HashSet<string> parts,
        bool csv, DatasetCatalog catalog, SeriesStore series, ProvenanceBuilder provenance, PointCalendars calendars, StatisticsOptions statisticsOptions,
        SpectralContext spectral, JsonSerializerOptions json, CancellationToken cancel)
    {
        var slug = point.Dataset.Slug;
        var timelines = await catalog.TimelinesAsync(point.Dataset, cancel);
        var chunks = await series.ReadCellAsync(point.Dataset.Id, point.Nearest.Cell.CellId, window.FromYear, window.ToYear, cancel);
        if (chunks.Count == 0)
            return PointOutcome.Failed(ApiProblems.Unprocessable("No series in the window",
                $"Cell {point.Nearest.Cell.CellId} of '{slug}' has no stored series{WindowText(window)}; stored years are " +
                $"{(timelines.Count == 0 ? "none" : $"{timelines.Keys.First()}..{timelines.Keys.Last()}")}."));
        ExactPointStatistics result;
        var analysisWindow = new AnalysisWindow(window.FromYear, window.ToYear, window.Months);
        bool atOutputPoint = point.Dataset.GridKind == StationSpectraAnswers.StationsKind;
        var cellId = point.Nearest.Cell.CellId;
        // At an output point the power per step is the one integrated from its spectra.
        float[]? spectralPower = atOutputPoint ? (await spectral.Answers.AlignedStepsAsync(point.Dataset.Id, cellId, chunks, timelines, cancel))[SpectralProduct.Power] : null;
        using (var decoded = PointSeriesReader.DecodeRented(chunks, timelines, point.Nearest.Cell.DepthMetres is { } d ? d : double.NaN))
            result = ExactPointAnalysis.Analyse(decoded.ToCellSeries() with { Power = spectralPower }, new ExactPointOptions
            {
                Window = analysisWindow,
                Statistics = statisticsOptions,
            }, calendars.For(decoded.Times));
        var periods = result.Periods.Where(p => onlyPeriod is not { } only || p.Period == only).ToArray();
        SpectralPointAnswer? spectralAnswer = null;
        if (atOutputPoint)
        {
            // The directionality of a period from its period-mean J_theta summed over the spectra's direction bins.
            var byPeriod = await spectral.Answers.PeriodSpectraAsync(point.Dataset, cellId, periods.Select(p => p.Period).ToList(), analysisWindow, cancel);
            periods = periods.Select(p => byPeriod.TryGetValue(p.Period, out var s)
                ? p with { Direction = p.Direction with { DirectionalityCoefficient = s.DirectionalityCoefficient, MaxPowerFromDeg = s.MaxPowerFromDeg } }
                : p).ToArray();
            var c = point.Nearest.Cell;
            spectralAnswer = await spectral.Answers.AnswerAsync(point.Dataset, cellId, c.Latitude, c.Longitude, c.DepthMetres, null, analysisWindow, timelines, cancel);
        }
        else if (spectral.Nearest is { } nearest)
        {
            var stationTimelines = await catalog.TimelinesAsync(nearest.Dataset, cancel);
            spectralAnswer = await spectral.Answers.AnswerAsync(nearest.Dataset, nearest.Cell.CellId, nearest.Cell.Latitude, nearest.Cell.Longitude,
                nearest.Cell.DepthMetres, nearest.DistanceKm, analysisWindow, stationTimelines, cancel);
        }
        if (spectralAnswer is not null && onlyPeriod is { } one)
            spectralAnswer = spectralAnswer with { Periods = spectralAnswer.Periods.Where(p => p.Period == one).ToList() };
        if (periods.Length == 0)
            return PointOutcome.Failed(ApiProblems.Unprocessable("The period has no steps in the window",
                $"{onlyPeriod!.Value.Name} has no step{WindowText(window)} at cell {point.Nearest.Cell.CellId}; widen the window or choose another period."));

        var source = await provenance.ForAsync(point.Dataset, cancel);
        var cell = point.Cell;
        var units = WaveParameterNames.All.ToDictionary(p => p.Symbol(), p => p.Unit());
        if (csv) return new PointOutcome(Csv(slug, cell, window, periods, source), "text/csv; charset=utf-8", $"{slug}_point_{cell.Id}.csv", null);

        var annual = result.Find(AtlasPeriod.Annual);
        var statistics = new PointStatistics(
            slug, cell, new PointWindow(window.FromYear, window.ToYear, window.Months), result.StepsInWindow, result.DeepWaterAssumed,
            result.EnergyPeriodSource, result.QuantileDefinition, units, periods,
            parts.Contains("exceedance") ? new PointExceedance(result.HsExceedance, result.PowerExceedance) : null,
            parts.Contains("joint") ? result.JointOccurrence : null,
            parts.Contains("rose") && annual is not null ? RoseOf(annual.Direction) : null,
            parts.Contains("interannual") ? result.InterAnnual : null,
            source, AtlasCaution.Text)
        {
            PowerFrom = atOutputPoint ? "spectra" : "Hs and Te",
            Spectral = spectralAnswer,
        };
        return new PointOutcome(JsonSerializer.SerializeToUtf8Bytes(statistics, json), "application/json; charset=utf-8", null, null);
    }

    /// <summary>
    /// Everything that shapes a point response: the dataset and the stamps of its files and statistics, the asked
    /// position (the cell's distance from it is part of the answer), the cell, the window, period, parts and format.
    /// </summary>
    private static async Task<string> ResponseKeyAsync(LocatedPoint point, (double Latitude, double Longitude) position, YearWindow window,
        AtlasPeriod? onlyPeriod, HashSet<string> parts, bool csv, DatasetCatalog catalog, DatasetRecord? outputPoints, CancellationToken cancel)
    {
        var files = await catalog.SeriesStampAsync(point.Dataset, cancel);
        var computed = await catalog.StatisticsStampAsync(point.Dataset, cancel);
        // The nearest output point's answer changes when its dataset is loaded again.
        var pointsStamp = outputPoints is null ? "" : $"{outputPoints.Id}:{outputPoints.CreatedAtUtc.Ticks}:{(await catalog.SeriesStampAsync(outputPoints, cancel)).Token}";
        return string.Join('|', "point", point.Dataset.Id, point.Dataset.CreatedAtUtc.Ticks, files.Token, computed.Token, pointsStamp,
            position.Latitude.ToString("R", CultureInfo.InvariantCulture), position.Longitude.ToString("R", CultureInfo.InvariantCulture),
            point.Nearest.Cell.CellId, window.FromYear, window.ToYear, window.Months is { } m ? string.Join(',', m) : "",
            onlyPeriod?.Name ?? "all", csv ? "csv" : string.Join(',', PointStatisticsQuery.Parts.Where(parts.Contains)));
    }

    /// <summary>
    /// The response, or 304 when the client already holds it (If-None-Match); tagged for revalidation, and sent in
    /// its stored gzip form to clients that accept it (the compression middleware leaves encoded responses alone).
    /// </summary>
    private static Results<FileContentHttpResult, StatusCodeHttpResult, ProblemHttpResult, ValidationProblem> Respond(PointResponse response, HttpContext http)
    {
        var headers = http.Response.Headers;
        headers.ETag = response.ETag;
        headers.CacheControl = "public, no-cache";
        headers.Vary = "Accept-Encoding";
        if (http.Request.Headers.IfNoneMatch.Contains(response.ETag)) return TypedResults.StatusCode(StatusCodes.Status304NotModified);
        if (response.Gzipped is { } gzipped && AcceptsGzip(http.Request))
        {
            headers.ContentEncoding = "gzip";
            return TypedResults.File(gzipped, response.ContentType, response.FileName);
        }
        return TypedResults.File(response.Content, response.ContentType, response.FileName);
    }

    private static bool AcceptsGzip(HttpRequest request)
    {
        foreach (var value in request.Headers.AcceptEncoding)
            foreach (var coding in (value ?? "").Split(','))
            {
                var parts = coding.Split(';', StringSplitOptions.TrimEntries);
                if (!parts[0].Equals("gzip", StringComparison.OrdinalIgnoreCase)) continue;
                // "gzip;q=0" refuses it.
                return !parts.Skip(1).Any(p => p.Replace(" ", "") is "q=0" or "q=0.0" or "q=0.00" or "q=0.000");
            }
        return false;
    }

    /// <summary>What the point answer needs of the output points: the service, and the nearest point of a gridded dataset's companions.</summary>
    private sealed record SpectralContext(StationSpectraAnswers Answers, (DatasetRecord Dataset, CellRecord Cell, double DistanceKm)? Nearest,
        (double Latitude, double Longitude) Position);

    private static PowerRose RoseOf(DirectionStatistics direction) => new(
        DirectionStatistics.Sectors, DirectionStatistics.SectorWidthDegrees,
        Enumerable.Range(0, DirectionStatistics.Sectors).Select(k => k * DirectionStatistics.SectorWidthDegrees).ToArray(),
        direction.PowerRose);

    private static readonly WaveParameter[] Summarised = [WaveParameter.Hs, WaveParameter.Te, WaveParameter.Tp, WaveParameter.J, WaveParameter.Spread, WaveParameter.D];

    private static byte[] Csv(string slug, PointCell cell, YearWindow window, IReadOnlyList<PeriodStatistics> periods, Provenance source)
    {
        var text = new StringBuilder();
        text.Append(CultureInfo.InvariantCulture, $"# point statistics of dataset {slug}, cell {cell.Id} at lat {cell.Lat:0.#####} lon {cell.Lon:0.#####}, ")
            .Append(CultureInfo.InvariantCulture, $"depth_m {(cell.DepthM is { } d ? d.ToString("0.##", CultureInfo.InvariantCulture) : "unknown (deep water assumed)")}, ")
            .Append(CultureInfo.InvariantCulture, $"distance_m {cell.DistanceM:0.#}\n");
        text.Append("# window: ").Append(window.FromYear?.ToString(CultureInfo.InvariantCulture) ?? "first year").Append("..")
            .Append(window.ToYear?.ToString(CultureInfo.InvariantCulture) ?? "last year")
            .Append(window.Months is { } m ? "; months " + string.Join(' ', m) : "; all months").Append('\n');
        text.Append("# units: hs m; te s; tp s; j kW/m; spread degree; d 1; dir degree true (power-weighted mean of the direction waves come from); count steps; coverage 1\n");
        text.Append("# percentiles exact from the series (Hyndman-Fan type 7); sd is the population standard deviation\n");
        foreach (var line in source.HeaderLines()) text.Append(line).Append('\n');
        text.Append("period,parameter,mean,sd,min,max,p10,p50,p90,p99,count,coverage,low_coverage\n");
        foreach (var p in periods)
        {
            foreach (var parameter in Summarised)
            {
                var s = p.Summary(parameter);
                text.Append(p.Period.Name).Append(',').Append(parameter.Symbol());
                foreach (var v in new[] { s.Mean, s.Sd, s.Min, s.Max, s.P10, s.P50, s.P90, s.P99 }) Number(text, v);
                text.Append(',').Append(s.Count.ToString(CultureInfo.InvariantCulture));
                Number(text, s.Coverage);
                text.Append(',').Append(p.LowCoverage ? "true" : "false").Append('\n');
            }
            text.Append(p.Period.Name).Append(",dir");
            Number(text, p.Direction.Mean);
            text.Append(",,,,,,,");
            text.Append(',').Append(p.Direction.Count.ToString(CultureInfo.InvariantCulture));
            Number(text, p.Direction.Coverage);
            text.Append(',').Append(p.LowCoverage ? "true" : "false").Append('\n');
        }
        return new UTF8Encoding(false).GetBytes(text.ToString());
    }

    private static void Number(StringBuilder text, double value)
    {
        text.Append(',');
        // At the precision of the single-precision data, as in the JSON answers.
        if (double.IsFinite(value)) text.Append(DataPrecisionJsonConverter.Round(value).ToString("R", CultureInfo.InvariantCulture));
    }

    private static string WindowText(YearWindow w) =>
        w.FromYear is null && w.ToYear is null && w.Months is null ? "" : $" in the window {w.FromYear?.ToString(CultureInfo.InvariantCulture) ?? "..."}-{w.ToYear?.ToString(CultureInfo.InvariantCulture) ?? "..."}" + (w.Months is { } m ? $" months {string.Join(',', m)}" : "");
}
