namespace Atlas.Api.Assessment;

/// <summary>
/// <c>/api/v1/datasets/{slug}/layers/yield/{device}.{format}</c> and <c>/layers/accessibility.{format}</c>: device
/// production and accessibility over every wet cell, for the map and for download.
/// </summary>
public static class AssessmentLayerApi
{
    public static IEndpointRouteBuilder MapAssessmentLayerApi(this IEndpointRouteBuilder routes)
    {
        var group = routes.MapGroup("/api/v1/datasets/{slug}/layers").WithTags("Layers");
        group.MapGet("/yield/{device}.{format}", YieldAsync)
            .ProducesLayerFiles()
            .RequireExpensiveLimit();
        group.MapGet("/accessibility.{format}", AccessibilityAsync)
            .ProducesLayerFiles()
            .RequireExpensiveLimit();
        return routes;
    }

    [EndpointName("YieldLayer")]
    [EndpointSummary("Mean annual energy of a device at every wet cell (MWh/yr), with capacity factor and share outside the matrix")]
    [EndpointDescription(
        "device: a stored device's slug. format: json, csv, geojson or tif (the annual energy on the grid); the CSV is plain RFC 4180 " +
        "and its units, provenance and caution are in its W3C CSV on the Web metadata at the same path with -metadata.json added " +
        "(.csv-metadata.json), named by the Link header with rel=describedby. interpolation: " +
        "bilinear (default) or nearest. Computed from every cell's exact series on first request (this takes a while for a " +
        "large dataset), then served from the layer cache until the dataset's statistics are recomputed.")]
    public static async Task<Results<FileContentHttpResult, ProblemHttpResult, ValidationProblem>> YieldAsync(
        string slug, string device, string format, [AsParameters] YieldLayerQuery query, DatasetCatalog catalog, CellStore cells, NpgsqlDataSource dataSource,
        LayerCacheStore cache, ProvenanceBuilder provenance, HttpContext http, CancellationToken cancel)
    {
        var metadata = CsvMetadataLinks.AsksForMetadata(ref device, ref format);
        var errors = new QueryErrors();
        var reading = MatrixInterpolationQuery.Read(query.Interpolation, errors);
        if (errors.Count > 0) return TypedResults.ValidationProblem(errors);
        if (!AssessmentLayerWriter.Formats.Contains(format)) return UnknownFormat(format);
        var dataset = await catalog.FindAsync(slug, cancel);
        if (dataset is null) return ApiProblems.UnknownDataset(slug);
        if (await new DeviceStore(dataSource).FindAsync(device, cancel) is not { } stored) return ApiProblems.UnknownDevice(device);
        if (AssessmentLayerBuilder.TimelineProblem(await catalog.TimelinesAsync(dataset, cancel)) is { } problem)
            return ApiProblems.Unprocessable("No layer for this dataset", $"Dataset '{slug}' cannot carry an assessment layer: {problem}.");
        var layer = await new AssessmentLayerBuilder(dataSource, cache).YieldAsync(dataset, stored, reading, cancel);
        return await RenderAsync(format, metadata, dataset, layer, $"{slug}_yield_{stored.Slug}.{format}", cells, provenance, http, cancel);
    }

    [EndpointName("AccessibilityLayer")]
    [EndpointSummary("Share of time within access limits at every wet cell, or the probability of a window of a given length")]
    [EndpointDescription(
        "hs_max: the Hs limit, m. tp_max (optional): the Tp limit, s. hours (optional): a required window length; the value is " +
        "then the probability that such a window starts at a random time. format: json, csv, geojson or tif (the CSV's CSVW metadata at " +
        "accessibility.csv-metadata.json with the same query). Cached like the yield layer.")]
    public static async Task<Results<FileContentHttpResult, ProblemHttpResult, ValidationProblem>> AccessibilityAsync(
        string slug, string format, [AsParameters] AccessLimitsQuery query, DatasetCatalog catalog, CellStore cells, NpgsqlDataSource dataSource,
        LayerCacheStore cache, ProvenanceBuilder provenance, HttpContext http, CancellationToken cancel)
    {
        var metadata = format == "csv" + CsvMetadataLinks.PathSuffix;
        if (metadata) format = "csv";
        var errors = new QueryErrors();
        var limits = query.Limits(errors);
        var duration = query.Duration("the window length in hours", errors, required: false);
        if (errors.Count > 0 || limits is null) return TypedResults.ValidationProblem(errors, title: "The accessibility layer request has invalid query values");
        if (!AssessmentLayerWriter.Formats.Contains(format)) return UnknownFormat(format);
        var dataset = await catalog.FindAsync(slug, cancel);
        if (dataset is null) return ApiProblems.UnknownDataset(slug);
        if (AssessmentLayerBuilder.TimelineProblem(await catalog.TimelinesAsync(dataset, cancel)) is { } problem)
            return ApiProblems.Unprocessable("No layer for this dataset", $"Dataset '{slug}' cannot carry an assessment layer: {problem}.");
        var builder = new AssessmentLayerBuilder(dataSource, cache);
        if (limits.TpLimitSeconds is not null && !(await builder.StoredVariablesAsync(dataset, cancel)).Contains(WaveParameter.Tp))
            return ApiProblems.Unprocessable("No Tp stored", $"Dataset '{slug}' stores no peak period, so a Tp limit cannot be applied; leave tp_max out.");
        var layer = await builder.AccessibilityAsync(dataset, limits, duration, cancel);
        return await RenderAsync(format, metadata, dataset, layer, $"{slug}_accessibility.{format}", cells, provenance, http, cancel);
    }

    private static async Task<Results<FileContentHttpResult, ProblemHttpResult, ValidationProblem>> RenderAsync(string format, bool metadata,
        Atlas.Storage.Datasets.DatasetRecord dataset, AssessmentLayer layer, string fileName, CellStore cells, ProvenanceBuilder provenance, HttpContext http,
        CancellationToken cancel)
    {
        if (metadata)
            return TypedResults.File(CsvwMetadataWriter.Write(AssessmentLayerWriter.CsvTableOf(dataset, layer, await provenance.ForAsync(dataset, cancel)),
                CsvMetadataLinks.PathForm(http.Request, metadata: false)), CsvwMetadataWriter.MediaType, fileName + CsvMetadataLinks.PathSuffix);
        if (format == "csv") CsvMetadataLinks.Describe(http.Response, CsvMetadataLinks.PathForm(http.Request, metadata: true));
        var cellMap = (await cells.AllAsync(dataset.Id, cancel)).ToDictionary(c => c.CellId);
        try
        {
            var content = AssessmentLayerWriter.Write(format, dataset, layer, cellMap, await provenance.ForAsync(dataset, cancel));
            return TypedResults.File(content, AssessmentLayerWriter.ContentType(format), fileName);
        }
        catch (NotSupportedException e)
        {
            return ApiProblems.Unprocessable("No GeoTIFF for this grid", e.Message);
        }
    }

    /// <summary>Declares the layer files (JSON, CSV, GeoJSON, GeoTIFF) and the 404 and 422 problems of an assessment layer.</summary>
    private static RouteHandlerBuilder ProducesLayerFiles(this RouteHandlerBuilder endpoint) =>
        endpoint.ProducesFile(AssessmentLayerWriter.ContentType("json"),
                [.. AssessmentLayerWriter.Formats.Skip(1).Select(AssessmentLayerWriter.ContentType), CsvwMetadataWriter.MediaType])
            .ProducesProblems(StatusCodes.Status404NotFound, StatusCodes.Status422UnprocessableEntity);

    private static ProblemHttpResult UnknownFormat(string format) =>
        ApiProblems.NotFound("Unknown format", $"'.{format}' is not an assessment layer format: use {string.Join(", ", AssessmentLayerWriter.Formats.Select(f => "." + f))}.");
}
