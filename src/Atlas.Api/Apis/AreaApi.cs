using NetTopologySuite.Geometries.Prepared;

namespace Atlas.Api.Apis;

/// <summary><c>POST /api/v1/datasets/{slug}/area</c>: statistics of a layer over the cells inside a polygon.</summary>
public static class AreaApi
{
    public const string Method =
        "Cells count as inside when their centre lies in the interior of the area (centres on the boundary are outside, as " +
        "PostGIS ST_Within). mean, min, max and the percentiles (Hyndman-Fan type 7, NumPy's default) are over the cells' values; " +
        "area_weighted_mean weights each cell by its footprint area. Areas are on the WGS 84 spheroid: area_km2 of the polygon " +
        "as sent, cell_area_km2 and area_above_threshold_km2 as the sum of the footprints of the cells inside (strictly above the threshold).";

    public static IEndpointRouteBuilder MapAreaApi(this IEndpointRouteBuilder routes)
    {
        routes.MapPost("/api/v1/datasets/{slug}/area", AreaAsync).WithTags("Areas")
            .Accepts<object>("application/geo+json", "application/json")
            .ProducesProblems(StatusCodes.Status404NotFound, StatusCodes.Status413PayloadTooLarge, StatusCodes.Status422UnprocessableEntity)
            .RequireExpensiveLimit();
        return routes;
    }

    [EndpointName("AreaStatistics")]
    [EndpointSummary("Statistics of one layer over the wet cells inside a polygon")]
    [EndpointDescription(
        "Body: a GeoJSON Polygon or MultiPolygon (or a Feature with one, or {\"bbox\": [west, south, east, north]}), degrees. " +
        "Query: parameter (default j), statistic (default mean), period (default annual), threshold (optional, in the layer's unit). " +
        "Rejected with a problem saying what to fix: invalid or self-intersecting rings (422), areas above the size limit (422), " +
        "too many vertices or too large a body (413), areas holding no wet cell (422).")]
    public static async Task<Results<Ok<AreaStatistics>, ProblemHttpResult, ValidationProblem>> AreaAsync(
        string slug, [AsParameters] AreaQuery query,
        HttpRequest request, DatasetCatalog catalog, StatisticsStore statistics, AreaQueries areas, CellFootprints footprints,
        ProvenanceBuilder provenance, IOptions<AtlasApiOptions> options, CancellationToken cancel)
    {
        var limits = options.Value;
        var errors = new QueryErrors();
        if (query.Read(errors) is not { } layer) return TypedResults.ValidationProblem(errors, title: "The area request has invalid query values");
        var (p, s, t, level) = layer;

        if (request.ContentLength > limits.MaxRequestBodyBytes)
            return ApiProblems.TooLarge($"The body is {request.ContentLength} bytes; the limit is {limits.MaxRequestBodyBytes}. Simplify the polygon.");
        var body = await RequestBody.ReadAsync(request, limits.MaxRequestBodyBytes, cancel);
        if (body is null)
            return ApiProblems.TooLarge($"The body exceeds the limit of {limits.MaxRequestBodyBytes} bytes. Simplify the polygon.");

        var dataset = await catalog.FindAsync(slug, cancel);
        if (dataset is null) return ApiProblems.UnknownDataset(slug);

        var reading = AreaGeometryReader.Read(body, limits.AreaMaxVertices);
        if (reading.Area is not { } area) return TypedResults.Problem(statusCode: reading.Status, title: reading.Title, detail: reading.Problem);
        var areaKm2 = await areas.SpheroidAreaSquareMetresAsync(area, cancel) / 1e6;
        if (areaKm2 > limits.AreaMaxSquareKilometres)
            return ApiProblems.Unprocessable("The area is too large",
                $"The polygon covers {areaKm2:0.#} km2; the limit is {limits.AreaMaxSquareKilometres:0.#} km2. Send a smaller area, or download the layer (GET .../layers) and summarise it locally.");

        var cells = await footprints.ForAsync(dataset, cancel);
        var prepared = PreparedGeometryFactory.Prepare(area);
        var inside = cells.Values.Where(c => prepared.Contains(new Point(c.Longitude, c.Latitude))).ToArray();
        if (inside.Length == 0)
        {
            var spacing = await catalog.TypicalSpacingMetresAsync(dataset, cancel);
            return ApiProblems.Unprocessable("No cell inside the area",
                $"No wet cell of '{slug}' has its centre inside the polygon ({areaKm2:0.###} km2). Cells are about " +
                $"{(spacing ?? 0) / 1000:0.##} km apart: draw the area over the sea within the dataset extent, and larger than one cell.");
        }

        var values = (await statistics.LayerAsync(dataset.Id, p, t, s,
                await catalog.CellLookupAsync(dataset, cancel), cancel: cancel))
            .ToDictionary(v => v.CellId, v => v.Value);
        var withValue = inside.Where(c => values.ContainsKey(c.CellId)).ToArray();
        var sorted = withValue.Select(c => values[c.CellId]).Order().ToArray();
        double? Stat(Func<double> f) => sorted.Length == 0 ? null : f();
        var weight = withValue.Sum(c => c.SquareKilometres);
        var above = level is { } l ? withValue.Where(c => values[c.CellId] > l).ToArray() : null;

        return TypedResults.Ok(new AreaStatistics(
            slug, new LayerChoice(p.Symbol(), s.Name(), t.Name, ParameterCatalogue.UnitOf(p, s)),
            areaKm2, inside.Length, withValue.Length, inside.Sum(c => c.SquareKilometres),
            Stat(() => sorted.Average()),
            Stat(() => withValue.Sum(c => values[c.CellId] * c.SquareKilometres) / weight),
            Stat(() => sorted[0]), Stat(() => sorted[^1]),
            Stat(() => ExactQuantile.OfSorted(sorted, 0.10)), Stat(() => ExactQuantile.OfSorted(sorted, 0.50)), Stat(() => ExactQuantile.OfSorted(sorted, 0.90)),
            level, above?.Length, above?.Sum(c => c.SquareKilometres),
            Method, await provenance.ForAsync(dataset, cancel), AtlasCaution.Text));
    }
}
