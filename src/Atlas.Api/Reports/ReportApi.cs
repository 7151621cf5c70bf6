namespace Atlas.Api.Reports;

/// <summary>
/// <c>GET /api/v1/datasets/{slug}/point/report.pdf</c> (the site report of the wet cell nearest a position) and
/// <c>POST /api/v1/datasets/{slug}/area/report.pdf</c> (the area report of a polygon).
/// </summary>
public static class ReportApi
{
    public static IEndpointRouteBuilder MapReportApi(this IEndpointRouteBuilder routes)
    {
        var group = routes.MapGroup("/api/v1/datasets/{slug}").WithTags("Reports");
        group.MapGet("/point/report.pdf", SiteReportAsync)
            .ProducesFile("application/pdf")
            .ProducesProblems(StatusCodes.Status404NotFound, StatusCodes.Status422UnprocessableEntity)
            .RequireExpensiveLimit();
        group.MapPost("/area/report.pdf", AreaReportAsync)
            .Accepts<object>("application/geo+json", "application/json")
            .ProducesFile("application/pdf")
            .ProducesProblems(StatusCodes.Status404NotFound, StatusCodes.Status413PayloadTooLarge, StatusCodes.Status422UnprocessableEntity)
            .RequireExpensiveLimit();
        return routes;
    }

    [EndpointName("SiteReport")]
    [EndpointSummary("A site report (PDF) of the wet cell nearest a position")]
    [EndpointDescription(
        "lat, lon: degrees. from, to: calendar years (inclusive); months: calendar months 1..12 (comma separated) restrict the statistics. " +
        "device (optional): a stored device's name or slug, adds its yield. hs_max (default 2 m) and hours (default 12): the access limit and " +
        "length of the weather windows. An A4 PDF: location map on the dataset's land mask, the cell, depth and distances; annual and " +
        "seasonal Hs, Te, Tp, J, directionality and direction; monthly means, exceedance, inter-annual variation and power rose; the joint " +
        "Hm0-Te table by occurrence and by energy; the skill of the nearest measuring station; device yield; weather windows; extreme Hs " +
        "with its cautions; method notes and ingest assumptions; source files with their checksums (BLAKE3, or SHA-256 for files loaded before); a citation line; page numbers and " +
        "the caution on every page. Its numbers are those of /point, /point/windows, /point/extremes and /point/yield for the same query. " +
        "Windows, yield and extremes use whole years (from, to); months restrict the statistics only.")]
    public static async Task<Results<FileContentHttpResult, ProblemHttpResult, ValidationProblem>> SiteReportAsync(
        string slug, [AsParameters] PointPosition at, [AsParameters] SiteReportQuery query, SiteReportService reports, CancellationToken cancel)
    {
        var errors = new QueryErrors();
        var request = query.Request(slug, at, errors);
        if (request is null) return TypedResults.ValidationProblem(errors, title: "The report request has invalid query values");
        var (content, problem) = await reports.GatherAsync(request, cancel);
        if (content is null) return problem!;
        return TypedResults.File(SiteReportService.Write(content), "application/pdf", $"{slug}_site_report_cell_{content.Statistics.Cell.Id}.pdf");
    }

    [EndpointName("AreaReport")]
    [EndpointSummary("An area report (PDF) of a polygon: the layer on a map, the area statistics, shares above thresholds, screening")]
    [EndpointDescription(
        "Body: as POST /area (a GeoJSON Polygon or MultiPolygon, a Feature with one, or {\"bbox\": [west, south, east, north]}). " +
        "Query: parameter (default j), statistic (default mean), period (default annual), threshold (optional): the layer, as POST /area; " +
        "min_power_kw_m, min_depth_m, max_depth_m, max_coast_distance_km, max_hs_p90_m (each optional): the screening criteria of " +
        "GET /screen, read for the layer's period. An A4 PDF: the polygon on a map of the layer over the dataset's land mask with a " +
        "colour bar, the area statistics (those POST /area answers), the share of the cells' area above thresholds (the statistics " +
        "options' thresholds for j and hs, round steps otherwise, and the asked one), the screening result inside the area, method " +
        "notes, source files with checksums, page numbers and the caution on every page. Refused as POST /area refuses.")]
    public static async Task<Results<FileContentHttpResult, ProblemHttpResult, ValidationProblem>> AreaReportAsync(
        string slug, [AsParameters] AreaReportQuery query, HttpRequest request, AreaReportService reports, IOptions<AtlasApiOptions> options,
        CancellationToken cancel)
    {
        var errors = new QueryErrors();
        var layer = query.Layer.Read(errors);
        var criteria = query.Screening.Read(errors);
        if (layer is null || criteria is null) return TypedResults.ValidationProblem(errors, title: "The area report request has invalid query values");
        var (body, tooLarge) = await AreaBody.ReadAsync(request, options.Value, cancel);
        if (body is null) return tooLarge!;
        var (p, s, t, level) = layer.Value;
        var (content, problem) = await reports.GatherAsync(slug, body, p, s, t, level, criteria, cancel);
        if (content is null) return problem!;
        return TypedResults.File(AreaReportService.Write(content), "application/pdf", $"{slug}_area_report_{p.Symbol()}_{s.Name()}_{t.Name}.pdf");
    }
}
