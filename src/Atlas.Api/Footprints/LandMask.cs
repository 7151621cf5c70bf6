using NetTopologySuite.Operation.Union;

namespace Atlas.Api.Footprints;

/// <summary>
/// A dataset's own land mask: the footprints of its dry cells merged into polygons (EPSG:4326), cached per dataset.
/// On a regular grid each dry cell is the rectangle halfway to its neighbouring grid lines (as the wet cells'
/// footprints are); elsewhere it is its Voronoi region among all cells, clipped to one typical spacing. The page's
/// land and the figures' land are both this.
/// </summary>
public sealed class LandMask(CellStore cells, DatasetCatalog catalog, IMemoryCache cache)
{
    /// <summary>The land polygons (empty when the dataset has no dry cell) and the number of dry cells.</summary>
    public async Task<(IReadOnlyList<Polygon> Land, int DryCells)> ForAsync(DatasetRecord dataset, CancellationToken cancel) =>
        await cache.GetOrCreateAsync(("land-mask", dataset.Id, dataset.CreatedAtUtc), async entry =>
        {
            entry.AbsoluteExpirationRelativeToNow = TimeSpan.FromMinutes(30);
            var all = await cells.AllAsync(dataset.Id, cancel);
            var dry = all.Where(c => !c.Wet).ToArray();
            IEnumerable<Polygon> footprints;
            if (dry.Length == 0) footprints = [];
            else if (dataset.GridKind == "regular" && GridAxes.From(dataset.GridJson) is { } axes)
                footprints = CellFootprints.OnRegularGrid(axes, dry).Values.Select(f => f.Polygon);
            else
            {
                var spacing = await catalog.TypicalSpacingMetresAsync(dataset, cancel) ?? 1000;
                var dryIds = dry.Select(c => c.CellId).ToHashSet();
                footprints = CellFootprints.Voronoi(all, spacing).Values.Where(f => dryIds.Contains(f.CellId)).Select(f => f.Polygon);
            }
            var polygons = footprints.ToArray();
            var land = polygons.Length == 0 ? null : UnaryUnionOp.Union(polygons);
            IReadOnlyList<Polygon> parts = Enumerable.Range(0, land?.NumGeometries ?? 0).Select(k => land!.GetGeometryN(k)).OfType<Polygon>().ToArray();
            return (parts, dry.Length);
        });
}
