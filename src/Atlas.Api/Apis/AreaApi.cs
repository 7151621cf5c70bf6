namespace Atlas.Api.Apis;

/// <summary><c>POST /api/v1/datasets/{slug}/area</c>: statistics of a layer over the cells inside a polygon.</summary>
public static class AreaApi
{
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
        HttpRequest request, AreaStatisticsService areas, IOptions<AtlasApiOptions> options, CancellationToken cancel)
    {
        var errors = new QueryErrors();
        if (query.Read(errors) is not { } layer) return TypedResults.ValidationProblem(errors, title: "The area request has invalid query values");
        var (p, s, t, level) = layer;

        var (body, tooLarge) = await AreaBody.ReadAsync(request, options.Value, cancel);
        if (body is null) return tooLarge!;
        var (selection, problem) = await areas.SelectAsync(slug, body, cancel);
        if (selection is null) return problem!;
        var values = await areas.LayerAsync(selection.Dataset, p, s, t, cancel);
        return TypedResults.Ok(await areas.StatisticsAsync(selection, p, s, t, level, values, cancel));
    }
}
