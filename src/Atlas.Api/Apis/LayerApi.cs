using Atlas.Api.Infrastructure;
using Atlas.Api.Layers;
using Atlas.Api.Model;
using Atlas.Api.Vocabulary;
using Atlas.Statistics;
using Atlas.Storage.Queries;
using Microsoft.AspNetCore.Http.HttpResults;
using Microsoft.Extensions.Options;
using Microsoft.Net.Http.Headers;

namespace Atlas.Api.Apis;

/// <summary><c>/api/v1/datasets/{slug}/layers</c>: the stored statistics as map layers and downloads.</summary>
public static class LayerApi
{
    public static IEndpointRouteBuilder MapLayerApi(this IEndpointRouteBuilder routes)
    {
        var group = routes.MapGroup("/api/v1/datasets/{slug}/layers").WithTags("Layers");
        group.MapGet("/", ListAsync).WithName("ListLayers")
            .WithSummary("The parameter x statistic x period combinations a dataset has, with units and percentile bin widths");
        group.MapGet("/{parameter}/{statistic}/{period}.{format}", DownloadAsync).WithName("DownloadLayer")
            .WithSummary("One layer as GeoTIFF, CSV, GeoJSON, NetCDF or a PNG figure")
            .WithDescription(
                "parameter: hs, te, tp, j, dir, spread, d, depth. statistic: mean, sd, min, max, p10, p50, p90, p99, count, coverage. " +
                "period: jan..dec, djf, mam, jja, son, annual, y2019. format: tif (Cloud Optimised GeoTIFF, Float32, EPSG:4326, " +
                "nodata -9999, 256 x 256 tiles with overviews; provenance in the GDAL metadata), csv (cell_id,lon,lat,value after a # header), " +
                "geojson (points, or cell footprints with ?geometry=polygon; provenance as a top-level member), nc (CF-1.8 NetCDF-4), " +
                "png (a captioned map figure). Mesh and curvilinear datasets are drawn on a raster by linear interpolation in triangles. " +
                "Responses carry an ETag and Cache-Control; send If-None-Match to revalidate. GeoTIFF downloads answer Range requests.")
            .Produces(200, contentType: "image/tiff")
            .RequireRateLimiting(RateLimits.Expensive);
        return routes;
    }

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
                var statistics = StatisticsOf(g.Key).Select(s => s.Name()).ToArray();
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

    /// <summary>
    /// The statistics a parameter's layers have: all for summarised parameters; for dir the power-weighted mean, the
    /// circular spread of directions (as sd), count and coverage; for d the period coefficient (as mean), count and
    /// coverage; for depth the cell depth (as mean).
    /// </summary>
    public static IReadOnlyList<StatisticKind> StatisticsOf(WaveParameter parameter) => parameter switch
    {
        WaveParameter.Dir => [StatisticKind.Mean, StatisticKind.Sd, StatisticKind.Count, StatisticKind.Coverage],
        WaveParameter.D => [StatisticKind.Mean, StatisticKind.Count, StatisticKind.Coverage],
        WaveParameter.Depth => [StatisticKind.Mean],
        _ => StatisticKindNames.All,
    };

    public static async Task<Results<FileContentHttpResult, ProblemHttpResult, ValidationProblem>> DownloadAsync(
        string slug, string parameter, string statistic, string period, string format, string? geometry,
        HttpContext http, DatasetCatalog catalog, LayerRenderer renderer, IOptions<AtlasApiOptions> options, CancellationToken cancel)
    {
        var dataset = await catalog.FindAsync(slug, cancel);
        if (dataset is null) return ApiProblems.UnknownDataset(slug);
        if (!WaveParameterNames.TryParse(parameter, out var p))
            return ApiProblems.NotFound("Unknown parameter", VocabularyMessages.UnknownParameter(parameter));
        if (!StatisticKindNames.TryParse(statistic, out var s))
            return ApiProblems.NotFound("Unknown statistic", VocabularyMessages.UnknownStatistic(statistic));
        if (!AtlasPeriod.TryParse(period, out var t))
            return ApiProblems.NotFound("Unknown period", VocabularyMessages.UnknownPeriod(period));
        if (!LayerFormats.TryParse(format, out var f))
            return ApiProblems.NotFound("Unknown format", $"'.{format}' is not a layer format: use {string.Join(", ", LayerFormats.Extensions.Select(e => "." + e))}.");
        if (!StatisticsOf(p).Contains(s))
            return ApiProblems.NotFound("No such layer", $"{p.Symbol()} has no '{s.Name()}' layer: its layers are {string.Join(", ", StatisticsOf(p).Select(x => x.Name()))}.");
        var polygons = false;
        if (geometry is not null)
        {
            if (f != LayerFormat.GeoJson)
                return TypedResults.ValidationProblem(new Dictionary<string, string[]> { ["geometry"] = ["geometry applies to .geojson downloads only; remove it."] });
            if (geometry is not ("point" or "polygon"))
                return TypedResults.ValidationProblem(new Dictionary<string, string[]> { ["geometry"] = [$"'{geometry}' is not a geometry: use point (cell centres, the default) or polygon (cell footprints)."] });
            polygons = geometry == "polygon";
        }

        var request = new LayerRequest(p, s, t, f, polygons);
        Storage.Queries.CachedLayer? layer;
        try
        {
            layer = await renderer.RenderAsync(dataset, request, cancel);
        }
        catch (ArgumentException e) when (f is LayerFormat.Tif or LayerFormat.Nc or LayerFormat.Png)
        {
            // A mesh whose valued nodes form no complete triangle cannot be drawn on a raster; the cell formats still work.
            return ApiProblems.Unprocessable("The layer cannot be drawn as a raster", $"{e.Message} Download it as .csv or .geojson instead.");
        }
        if (layer is null)
            return ApiProblems.NotFound("No statistics for this layer",
                $"Dataset '{slug}' has no {s.Name()} of {p.Symbol()} for {t.Name}. GET /api/v1/datasets/{slug}/layers lists what it has; " +
                "if it lists nothing, its statistics have not been computed yet (POST /api/v1/datasets/{slug}/jobs).");
        http.Response.Headers.CacheControl = $"public, max-age={options.Value.LayerCacheSeconds}";
        // Range requests let GIS clients read a Cloud Optimised GeoTIFF tile by tile.
        return TypedResults.File(layer.Content, layer.ContentType, request.FileName, entityTag: EntityTagHeaderValue.Parse(layer.ETag),
            enableRangeProcessing: f == LayerFormat.Tif);
    }
}
