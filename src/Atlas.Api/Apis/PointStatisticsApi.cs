using Microsoft.AspNetCore.Http.Json;

namespace Atlas.Api.Apis;

/// <summary><c>GET /api/v1/datasets/{slug}/point</c>: exact statistics from the stored series of the nearest wet cell.</summary>
public static class PointStatisticsApi
{
    public static RouteHandlerBuilder MapPointStatistics(this RouteGroupBuilder group) =>
        group.MapGet("/point", PointAsync)
            .WithDescription(Description(((IEndpointRouteBuilder)group).ServiceProvider.GetRequiredService<StatisticsOptions>().LowCoverageThreshold))
            .Produces<PointStatistics>(StatusCodes.Status200OK, "application/json", "text/csv", CsvwMetadataWriter.MediaType)
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
            "interannual (yearly annual and seasonal means and coefficients of variation), spectra (in the spectral block of an output " +
            "point: each period's mean frequency spectrum and power per direction bin, with their frequencies and directions; the " +
            "block's period summaries are always given); all by default, none for summaries only. " +
            "Statistics are computed exactly from the stored series (percentiles Hyndman-Fan type 7); the cell (id, lat, lon, depth_m, " +
            "distance_m) is the nearest wet cell. Coverage: " + MethodNotes.Coverage(lowCoverageThreshold) + ". " +
            "Seasons and the annual period: " + MethodNotes.Climatology + "; weighted percentiles: " + MethodNotes.WeightedPercentiles + ". " +
            "Inter-annual: " + MethodNotes.Seasons + "; " + MethodNotes.InterAnnual + ". Each period's direction block carries " +
            "directionality_coefficient and max_power_from_deg: " + MethodNotes.Directionality + ". The cell (id, lat, lon, depth_m, " +
            "distance_m) is the nearest wet cell, refused (422) beyond the distance limit or outside the extent. " +
            "format=csv gives the period table as plain RFC 4180 CSV (one header row, no comment lines); its units, provenance, method " +
            "notes and the caution are in its W3C CSV on the Web metadata (format=csvw with the same query, application/csvm+json), " +
            "which the CSV answer names in a Link header with rel=describedby.";

    [EndpointName("PointStatistics")]
    [EndpointSummary("Exact statistics of every parameter at the wet cell nearest a position")]
    public static async Task<Results<FileContentHttpResult, StatusCodeHttpResult, ProblemHttpResult, ValidationProblem>> PointAsync(
        string slug, [AsParameters] PointPosition at, [AsParameters] PointStatisticsQuery query,
        PointLocator locator, DatasetCatalog catalog, PointStatisticsService statistics, PointResponseCache responses, OutputPoints outputPoints,
        ProvenanceBuilder provenance, IOptions<JsonOptions> json, HttpContext http, CancellationToken cancel)
    {
        var errors = new QueryErrors();
        var position = at.Position(errors);
        var window = at.Window(errors, query.Months);
        var onlyPeriod = query.OnePeriod(errors);
        var parts = query.IncludedParts(errors);
        var form = query.Form(errors);
        var powerCurveStep = query.PowerCurveStep(errors);
        if (errors.Count > 0 || position is null || window is null || parts is null)
            return TypedResults.ValidationProblem(errors, title: "The point request has invalid query values");

        var (point, problem) = await locator.LocateAsync(slug, position.Value.Latitude, position.Value.Longitude, cancel);
        if (point is null) return problem!;
        if (form == TableFormat.CsvMetadata)
            return TypedResults.File(CsvwMetadataWriter.Write(CsvTableOf(slug, point.Cell, window, await provenance.ForAsync(point.Dataset, cancel)),
                CsvMetadataLinks.FormatForm(http.Request, "csv")), CsvwMetadataWriter.MediaType, $"{slug}_point_{point.Cell.Id}.csv-metadata.json");
        var csv = form == TableFormat.Csv;
        if (csv) CsvMetadataLinks.Describe(http.Response, CsvMetadataLinks.FormatForm(http.Request, CsvMetadataLinks.FormatValue));
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
        if (csv) return new PointOutcome(Csv(slug, cell, window, analysis.Periods, analysis.Source), CsvTable.ContentType, $"{slug}_point_{cell.Id}.csv", null);
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

    /// <summary>The description of the period table's CSV, from which its header and its CSVW metadata are written.</summary>
    private static CsvTable CsvTableOf(string slug, PointCell cell, YearWindow window, Provenance source)
    {
        string[] statistics = ["mean", "sd", "min", "max", "p10", "p50", "p90", "p99"];
        string[] titles = ["mean", "standard deviation", "minimum", "maximum", "10th percentile", "median", "90th percentile", "99th percentile"];
        var depth = cell.DepthM is { } d ? d.ToString("0.##", CultureInfo.InvariantCulture) + " m" : "unknown (deep water assumed)";
        var windowText = $"years {window.FromYear?.ToString(CultureInfo.InvariantCulture) ?? "from the first"} to {window.ToYear?.ToString(CultureInfo.InvariantCulture) ?? "the last"}" +
                         (window.Months is { } m ? ", months " + string.Join(' ', m) : ", all months");
        return new CsvTable(
            string.Create(CultureInfo.InvariantCulture, $"Point statistics of dataset {slug}, cell {cell.Id}"),
            string.Create(CultureInfo.InvariantCulture,
                $"Statistics of every parameter per period at cell {cell.Id} (lat {cell.Lat:0.#####}, lon {cell.Lon:0.#####}, depth {depth}), the wet cell nearest the asked position, " +
                $"{cell.DistanceM:0.#} m from it; window: {windowText}. One row per period and parameter."),
            [
                CsvColumn.Text("period", "period", "jan..dec, djf, mam, jja, son, annual or a year such as y2019"),
                CsvColumn.Text("parameter", "parameter", "hs (Hm0, m), te (energy period, s), tp (peak period, s), j (wave power, kW/m), spread (degree), d (directionality coefficient, 1), " +
                    "dir (degree true, the power-weighted mean of the direction waves come from; only mean, count and coverage)"),
                .. statistics.Select((s, i) => CsvColumn.Double(s, titles[i], "unit of the row's parameter", i == 1 ? "population standard deviation" : null)),
                CsvColumn.Integer("count", "steps with a value", "1"),
                CsvColumn.Double("coverage", "share of the calendar's expected steps present", "1"),
                CsvColumn.Boolean("low_coverage", "coverage below the threshold"),
            ],
            source,
            ["Percentiles are exact from the series (Hyndman-Fan type 7); sd is the population standard deviation.",
             "Units: hs m; te s; tp s; j kW/m; spread degree; d 1; dir degree true (power-weighted mean of the direction waves come from); count steps; coverage 1."]);
    }

    private static byte[] Csv(string slug, PointCell cell, YearWindow window, IReadOnlyList<PeriodStatistics> periods, Provenance source) =>
        CsvTableOf(slug, cell, window, source).ToBytes(rows =>
        {
            foreach (var p in periods)
            {
                foreach (var parameter in Summarised)
                {
                    var s = p.Summary(parameter);
                    rows.Text(p.Period.Name).Text(parameter.Symbol());
                    foreach (var v in new[] { s.Mean, s.Sd, s.Min, s.Max, s.P10, s.P50, s.P90, s.P99 }) Number(rows, v);
                    rows.Integer(s.Count);
                    Number(rows, s.Coverage);
                    rows.Boolean(p.LowCoverage).EndRow();
                }
                rows.Text(p.Period.Name).Text("dir");
                Number(rows, p.Direction.Mean);
                for (var k = 0; k < 7; k++) rows.Text(null);
                rows.Integer(p.Direction.Count);
                Number(rows, p.Direction.Coverage);
                rows.Boolean(p.LowCoverage).EndRow();
            }
        });

    // At the precision of the single-precision data, as in the JSON answers.
    private static void Number(CsvTableWriter rows, double value) =>
        rows.Number(double.IsFinite(value) ? DataPrecisionJsonConverter.Round(value) : double.NaN);

}
