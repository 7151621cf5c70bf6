namespace Atlas.Api.Apis;

/// <summary>
/// <c>GET /api/v1/datasets/{slug}/land</c>: the dataset's own land mask, the footprints of its dry cells merged into
/// polygons, so that a map can draw the coast the hindcast saw without any outside coastline.
/// </summary>
public static class LandMaskApi
{
    public const string RouteName = "LandMask";

    public static IEndpointRouteBuilder MapLandMaskApi(this IEndpointRouteBuilder routes)
    {
        routes.MapGet("/api/v1/datasets/{slug}/land", LandAsync).WithTags("Datasets").WithName(RouteName)
            .ProducesFile("application/geo+json")
            .ProducesProblems(StatusCodes.Status404NotFound);
        return routes;
    }

    [EndpointSummary("The dataset's land mask: its dry cells merged into GeoJSON polygons")]
    [EndpointDescription(
        "A GeoJSON FeatureCollection with one MultiPolygon feature (EPSG:4326 degrees) covering the dry cells: on a regular " +
        "grid each dry cell is the rectangle halfway to its neighbouring grid lines (as the wet cells' footprints are); elsewhere " +
        "it is its Voronoi region among all cells, clipped to one typical spacing. dry_cell_count says how many cells it holds; " +
        "a dataset with no dry cell (a mesh of wet nodes only) gives an empty collection.")]
    public static async Task<Results<FileContentHttpResult, ProblemHttpResult>> LandAsync(
        string slug, HttpContext http, DatasetCatalog catalog, DryCellLand land, CancellationToken cancel)
    {
        var dataset = await catalog.FindAsync(slug, cancel);
        if (dataset is null) return ApiProblems.UnknownDataset(slug);
        var found = await land.ForAsync(dataset, cancel);
        var body = Write(found.Polygons, found.DryCellCount);
        http.Response.Headers.CacheControl = "public, max-age=3600";
        return TypedResults.File(body!, "application/geo+json");
    }

    /// <summary>One MultiPolygon feature of the land's polygons (none when there is no land), with the count of dry cells.</summary>
    private static byte[] Write(IReadOnlyList<Polygon> parts, int dryCells)
    {
        IFeature[] features = parts.Count == 0 ? [] : [new Feature(GeoJsonWriter.MultiPolygon([.. parts]), new AttributesTable { { "kind", "land (dry cells)" } })];
        return GeoJsonWriter.FeatureCollection(json => json.WriteNumber("dry_cell_count", dryCells), features);
    }
}
