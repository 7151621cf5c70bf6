namespace Atlas.Api.Apis;

/// <summary><c>/api/v1/datasets/{slug}/point</c>: statistics and series at the wet cell nearest a position.</summary>
public static class PointApi
{
    public static IEndpointRouteBuilder MapPointApi(this IEndpointRouteBuilder routes)
    {
        var group = routes.MapGroup("/api/v1/datasets/{slug}").WithTags("Points");
        group.MapPointSeries();
        group.MapPointStatistics();
        return routes;
    }
}
