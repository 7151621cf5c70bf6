using Atlas.Api.Infrastructure;
using Atlas.Api.Model;
using Atlas.Api.Points;

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

    public static PointCell CellOf(LocatedPoint point)
    {
        var c = point.Nearest.Cell;
        // Depth and coast distance are stored as floats: written at their own precision, not their double expansion.
        return new PointCell(c.CellId, c.Latitude, c.Longitude, c.DepthMetres is { } d ? DataPrecisionJsonConverter.Round(d) : null,
            Math.Round(point.Nearest.DistanceMetres, 1), c.CoastDistanceMetres is { } k ? Math.Round(k, 1) : null);
    }
}
