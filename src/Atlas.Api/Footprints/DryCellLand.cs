using NetTopologySuite.Operation.Union;

namespace Atlas.Api.Footprints;

/// <summary>The land a dataset saw: its dry cells' footprints merged, and how many dry cells there are.</summary>
public sealed record DatasetLand(Geometry? Land, int DryCellCount)
{
    /// <summary>The land's polygons one by one (none when there is no land), as a map draws them.</summary>
    public IReadOnlyList<Polygon> Polygons { get; } =
        Enumerable.Range(0, Land?.NumGeometries ?? 0).Select(k => Land!.GetGeometryN(k)).OfType<Polygon>().ToArray();
}

/// <summary>
/// A dataset's own land mask, the footprints of its dry cells merged into polygons: on a regular grid each dry cell is
/// the rectangle halfway to its neighbouring grid lines (as the wet cells' footprints are); elsewhere its Voronoi
/// region among all cells, clipped to one typical spacing. The map page's land layer and the reports' location maps
/// draw this one mask, so a map never shows an outside coastline the hindcast did not see.
/// </summary>
public sealed class DryCellLand(DatasetCatalog catalog, CellStore cells, IMemoryCache cache)
{
    /// <summary>The merged land (null when the dataset has no dry cell), kept for half an hour.</summary>
    public async Task<DatasetLand> ForAsync(DatasetRecord dataset, CancellationToken cancel) =>
        (await cache.GetOrCreateAsync(("land", dataset.Id, dataset.CreatedAtUtc), async entry =>
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
            return new DatasetLand(polygons.Length == 0 ? null : UnaryUnionOp.Union(polygons), dry.Length);
        }))!;
}
