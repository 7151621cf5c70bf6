using Microsoft.Net.Http.Headers;

namespace Atlas.Api.Apis;

/// <summary><c>/api/v1/datasets/{slug}/layers</c>: the stored statistics as map layers and downloads.</summary>
public static class LayerApi
{
    public static IEndpointRouteBuilder MapLayerApi(this IEndpointRouteBuilder routes)
    {
        var group = routes.MapGroup("/api/v1/datasets/{slug}/layers").WithTags("Layers");
        group.MapGet("/", ListAsync)
            .ProducesProblems(StatusCodes.Status404NotFound);
        group.MapGet("/{parameter}/{statistic}/{period}.{format}", DownloadAsync)
            .ProducesFile(LayerFormat.Tif.ContentType(), [.. Enum.GetValues<LayerFormat>().Skip(1).Select(f => f.ContentType()), CsvwMetadataWriter.MediaType])
            .Produces(StatusCodes.Status304NotModified)
            .ProducesProblems(StatusCodes.Status404NotFound, StatusCodes.Status422UnprocessableEntity)
            .RequireExpensiveLimit();
        return routes;
    }

    [EndpointName("ListLayers")]
    [EndpointSummary("The parameter x statistic x period combinations a dataset has, with units and percentile bin widths")]
    public static async Task<Results<Ok<LayerCatalogue>, ProblemHttpResult>> ListAsync(string slug, DatasetCatalog catalog,
        DatasetGeometryQueries geometry, LayerRenderer renderer, CancellationToken cancel)
    {
        var dataset = await catalog.FindAsync(slug, cancel);
        if (dataset is null) return ApiProblems.UnknownDataset(slug);
        var combinations = (await geometry.LayerCombinationsAsync(dataset.Id, cancel)).ToList();
        if (await renderer.HasDepthsAsync(dataset, cancel) && combinations.All(c => c.Parameter != WaveParameter.Depth))
            combinations.Add(new LayerCombination(WaveParameter.Depth, AtlasPeriod.Annual));
        // The bins of the dataset's stored statistics (unknown while a pass with other options runs).
        var options = Ingest.Statistics.RecordedStatisticsOptions.Read(dataset.MetadataJson);
        var parameters = combinations
            .GroupBy(c => c.Parameter)
            .OrderBy(g => g.Key)
            .Select(g =>
            {
                var periods = g.Select(c => c.Period).Order().Select(p => p.Name).ToArray();
                var statistics = ParameterCatalogue.StatisticsOf(g.Key).Select(s => s.Name()).ToArray();
                double? binWidth = g.Key is WaveParameter.Dir or WaveParameter.D or WaveParameter.Depth ? null : options?.BinningFor(g.Key).BinWidth;
                return new LayerParameterItem(g.Key.Symbol(), ParameterCatalogue.LongName(g.Key), g.Key.Unit(), statistics, periods, binWidth,
                    $"/api/v1/datasets/{slug}/layers/{g.Key.Symbol()}/{statistics[0]}/{periods[0]}.tif");
            })
            .ToArray();
        return TypedResults.Ok(new LayerCatalogue(
            slug,
            $"/api/v1/datasets/{slug}/layers/{{parameter}}/{{statistic}}/{{period}}.{{format}}",
            LayerFormats.Extensions,
            StatisticKindNames.All.Select(s => new LayerStatisticItem(s.Name(), ParameterCatalogue.StatisticLongName(s))).ToArray(),
            parameters,
            "Layer percentiles (p10, p50, p90, p99) come from fixed-bin histograms and lie within one bin width (percentile_bin_width, " +
            "in the parameter's unit) of the exact percentiles; point requests compute them exactly from the series. count and coverage " +
            "are dimensionless (unit 1). dir offers the power-weighted circular mean, the circular spread of directions (sd), count and " +
            "coverage; d offers the period directionality coefficient (as mean: the largest period-mean directionally resolved power over " +
            "the period-mean power, IEC TS 62600-101, from a cosine-2s model of each step's directional distribution), count and coverage; " +
            "depth is the cell depth (mean, annual). Coverage is counted against the calendar, and seasons and the annual period are " +
            "month-balanced (see the dataset's method notes).",
            AtlasCaution.Text));
    }

    [EndpointName("DownloadLayer")]
    [EndpointSummary("One layer as GeoTIFF, CSV, GeoJSON, NetCDF or a PNG figure")]
    [EndpointDescription(
        "parameter: hs, te, tp, j, dir, spread, d, depth. statistic: mean, sd, min, max, p10, p50, p90, p99, count, coverage. " +
        "period: jan..dec, djf, mam, jja, son, annual, y2019. format: tif (Cloud Optimised GeoTIFF, Float32, EPSG:4326, " +
        "nodata -9999, 256 x 256 tiles with overviews; provenance in the GDAL metadata), csv (plain RFC 4180: the header cell_id,lon,lat,value, then one row per cell; " +
        "units, provenance, method notes and the caution are in its W3C CSV on the Web metadata at the same path with -metadata.json added " +
        "(.../annual.csv-metadata.json, media type application/csvm+json), named by the answer's Link header with rel=describedby), " +
        "geojson (points, or cell footprints with ?geometry=polygon; provenance as a top-level member), nc (CF-1.8 NetCDF-4), " +
        "png and svg (a consent figure: the map in the house colour scale with the land mask, graticule, north arrow, scale bar, " +
        "colour bar and a short caption; the full provenance is in the file's metadata, PNG iTXt chunks or SVG <metadata>, and in " +
        "the sidecar .figure.json beside it, e.g. .../annual.figure.json). Mesh and curvilinear datasets are drawn on a raster by linear interpolation in triangles. " +
        "Responses carry an ETag and Cache-Control; send If-None-Match to revalidate. GeoTIFF downloads answer Range requests.")]
    public static async Task<Results<FileContentHttpResult, ProblemHttpResult, ValidationProblem>> DownloadAsync(
        string slug, [AsParameters] LayerDownloadRoute route, HttpContext http, DatasetCatalog catalog, LayerRenderer renderer,
        IOptions<AtlasApiOptions> options, IOptions<Microsoft.AspNetCore.Http.Json.JsonOptions> json, CancellationToken cancel)
    {
        var dataset = await catalog.FindAsync(slug, cancel);
        if (dataset is null) return ApiProblems.UnknownDataset(slug);
        var errors = new QueryErrors();
        var request = route.Read(errors, out var notFound);
        if (notFound is not null) return notFound;
        if (request is null) return TypedResults.ValidationProblem(errors);
        if (dataset.GridKind == StationSpectraAnswers.StationsKind && request.Format is LayerFormat.Tif or LayerFormat.Nc or LayerFormat.Png or LayerFormat.Svg)
            return ApiProblems.Unprocessable("Output points have no raster",
                $"Dataset '{slug}' holds output points of a spectral hindcast, values at points with no area between them, so it is not drawn as a " +
                "raster. Download the layer as .geojson or .csv (one feature or row per output point).");
        if (request.Companion != LayerCompanion.None)
        {
            if (await renderer.LoadAsync(dataset, request, cancel) is not { } data) return NoLayer(slug, request);
            return request.Companion == LayerCompanion.CsvMetadata
                ? TypedResults.File(CsvwMetadataWriter.Write(LayerCsvWriter.Table(data), CsvMetadataLinks.PathForm(http.Request, metadata: false)),
                    CsvwMetadataWriter.MediaType, request.FileName)
                : TypedResults.File(LayerFigureRenderer.ProvenanceOf(data).SidecarJson(json.Value.SerializerOptions), "application/json", request.FileName);
        }
        Storage.Queries.CachedLayer? layer;
        try
        {
            layer = await renderer.RenderAsync(dataset, request, cancel);
        }
        catch (ArgumentException e) when (request.Format is LayerFormat.Tif or LayerFormat.Nc or LayerFormat.Png or LayerFormat.Svg)
        {
            // A mesh whose valued nodes form no complete triangle cannot be drawn on a raster; the cell formats still work.
            return ApiProblems.Unprocessable("The layer cannot be drawn as a raster", $"{e.Message} Download it as .csv or .geojson instead.");
        }
        if (layer is null) return NoLayer(slug, request);
        http.Response.Headers.CacheControl = $"public, max-age={options.Value.LayerCacheSeconds}";
        if (request.Format == LayerFormat.Csv) CsvMetadataLinks.Describe(http.Response, CsvMetadataLinks.PathForm(http.Request, metadata: true));
        // Range requests let GIS clients read a Cloud Optimised GeoTIFF tile by tile.
        return TypedResults.File(layer.Content, layer.ContentType, request.FileName, entityTag: EntityTagHeaderValue.Parse(layer.ETag),
            enableRangeProcessing: request.Format == LayerFormat.Tif);
    }

    private static ProblemHttpResult NoLayer(string slug, LayerRequest request) =>
        ApiProblems.NotFound("No statistics for this layer",
            $"Dataset '{slug}' has no {request.Statistic.Name()} of {request.Parameter.Symbol()} for {request.Period.Name}. GET /api/v1/datasets/{slug}/layers lists what it has; " +
            "if it lists nothing, its statistics have not been computed yet (POST /api/v1/datasets/{slug}/jobs).");
}
