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
            "then the whole window. include: comma-separated parts among exceedance (Hs and J exceedance curves over the window: " +
            "Hs every 0.1 m; J every j_step kW/m when given (0.1 or more; j_step=1 for the fine curve), by default every 1 kW/m " +
            $"or, where that would take more than {PointStatisticsService.DefaultPowerCurveThresholds} thresholds up to the largest J, " +
            "the smallest step of 2, 5, 10, 20, 50 ... kW/m that does not; each fraction is exact), " +
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
        PointLocator locator, DatasetCatalog catalog, PointStatisticsService statistics, PointResponseCache responses, OutputPoints outputPoints,
        IOptions<JsonOptions> json, HttpContext http, CancellationToken cancel)
    {
        var errors = new QueryErrors();
        var position = at.Position(errors);
        var window = at.Window(errors, query.Months);
        var onlyPeriod = query.OnePeriod(errors);
        var parts = query.IncludedParts(errors);
        var csv = query.Csv(errors);
        var powerCurveStep = query.PowerCurveStep(errors);
        if (errors.Count > 0 || position is null || window is null || parts is null)
            return TypedResults.ValidationProblem(errors, title: "The point request has invalid query values");

        var (point, problem) = await locator.LocateAsync(slug, position.Value.Latitude, position.Value.Longitude, cancel);
        if (point is null) return problem!;
        var nearestPoint = await outputPoints.NearestAsync(point.Dataset, position.Value.Latitude, position.Value.Longitude, cancel);
        var key = await ResponseKeyAsync(point, position.Value, window, onlyPeriod, parts, powerCurveStep, csv, catalog, nearestPoint?.Dataset, cancel);
        // Computed without the request's cancellation: other requests for the same key may be waiting on it.
        var (response, failure) = await responses.GetOrComputeAsync(key,
            () => ComputeAsync(point, window, onlyPeriod, parts, powerCurveStep, csv, statistics, json.Value.SerializerOptions, CancellationToken.None));
        return response is null ? failure! : Respond(response, http);
    }

    private static async Task<PointOutcome> ComputeAsync(LocatedPoint point, YearWindow window, AtlasPeriod? onlyPeriod, HashSet<string> parts,
        double? powerCurveStep, bool csv, PointStatisticsService statistics, JsonSerializerOptions json, CancellationToken cancel)
    {
        // The CSV is the period table alone; JSON computes the parts it carries and no others.
        var (analysis, problem) = await statistics.AnalyseAsync(point, window, onlyPeriod, cancel,
            csv ? ExactParts.None : PointStatisticsQuery.AnalysisParts(parts), powerCurveStep);
        if (analysis is null) return PointOutcome.Failed(problem!);
        var slug = point.Dataset.Slug;
        var cell = point.Cell;
        if (csv) return new PointOutcome(Csv(slug, cell, window, analysis.Periods, analysis.Source), "text/csv; charset=utf-8", $"{slug}_point_{cell.Id}.csv", null);
        return new PointOutcome(JsonSerializer.SerializeToUtf8Bytes(PointStatisticsService.Statistics(analysis, parts), json), "application/json; charset=utf-8", null, null);
    }

    /// <summary>
    /// Everything that shapes a point response: the dataset and the stamps of its files and statistics, the asked
    /// position (the cell's distance from it is part of the answer), the cell, the window, period, parts and format.
    /// </summary>
    private static async Task<string> ResponseKeyAsync(LocatedPoint point, (double Latitude, double Longitude) position, YearWindow window,
        AtlasPeriod? onlyPeriod, HashSet<string> parts, double? powerCurveStep, bool csv, DatasetCatalog catalog, DatasetRecord? outputPoints,
        CancellationToken cancel)
    {
        var files = await catalog.SeriesStampAsync(point.Dataset, cancel);
        var computed = await catalog.StatisticsStampAsync(point.Dataset, cancel);
        // The nearest output point's answer changes when its dataset is loaded again.
        var pointsStamp = outputPoints is null ? "" : $"{outputPoints.Id}:{outputPoints.CreatedAtUtc.Ticks}:{(await catalog.SeriesStampAsync(outputPoints, cancel)).Token}";
        return string.Join('|', "point", point.Dataset.Id, point.Dataset.CreatedAtUtc.Ticks, files.Token, computed.Token, pointsStamp,
            position.Latitude.ToString("R", CultureInfo.InvariantCulture), position.Longitude.ToString("R", CultureInfo.InvariantCulture),
            point.Nearest.Cell.CellId, window.FromYear, window.ToYear, window.Months is { } m ? string.Join(',', m) : "",
            onlyPeriod?.Name ?? "all", csv ? "csv" : string.Join(',', PointStatisticsQuery.Parts.Where(parts.Contains)),
            csv || !parts.Contains("exceedance") ? "" : powerCurveStep?.ToString("R", CultureInfo.InvariantCulture) ?? "auto");
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
        // Asked first: the compressed form is made only for a client that takes it.
        if (AcceptsGzip(http.Request) && response.Gzipped is { } gzipped)
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
}
