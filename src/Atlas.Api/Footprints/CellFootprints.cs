using Atlas.Hindcast.Geodesy;
using NetTopologySuite.Triangulate;

namespace Atlas.Api.Footprints;

/// <summary>The ground a wet cell stands for: its polygon (EPSG:4326) and its area on the spheroid.</summary>
public sealed record CellFootprint(int CellId, double Longitude, double Latitude, Polygon Polygon, double SquareKilometres);

/// <summary>
/// Footprints of the wet cells of a dataset, cached per dataset. On a regular grid a cell is the rectangle halfway
/// to its neighbouring grid lines (the end cells as wide as their neighbours). Elsewhere (mesh, curvilinear or
/// projected grids) a cell is its Voronoi region among the wet cells, computed with longitudes scaled by the cosine
/// of the mean latitude, and clipped to a square of one typical cell spacing around the cell so that coastal and
/// edge cells do not reach out over land or open ends.
/// </summary>
public sealed class CellFootprints(CellStore cells, DatasetCatalog catalog, IMemoryCache cache)
{
    private static readonly GeometryFactory Wgs84 = new(new PrecisionModel(), 4326);

    public async Task<IReadOnlyDictionary<int, CellFootprint>> ForAsync(DatasetRecord dataset, CancellationToken cancel)
    {
        return (await cache.GetOrCreateAsync(("footprints", dataset.Id, dataset.CreatedAtUtc), async entry =>
        {
            entry.AbsoluteExpirationRelativeToNow = TimeSpan.FromMinutes(10);
            var wet = (await cells.AllAsync(dataset.Id, cancel)).Where(c => c.Wet).ToArray();
            if (dataset.GridKind == "regular" && GridAxes.From(dataset.GridJson) is { } axes)
                return OnRegularGrid(axes, wet);
            var spacing = await catalog.TypicalSpacingMetresAsync(dataset, cancel) ?? 1000;
            return Voronoi(wet, spacing);
        }))!;
    }

    public static IReadOnlyDictionary<int, CellFootprint> OnRegularGrid(GridAxes axes, IEnumerable<CellRecord> wet)
    {
        var lonEdges = Edges(axes.Longitudes);
        var latEdges = Edges(axes.Latitudes);
        var result = new Dictionary<int, CellFootprint>();
        foreach (var c in wet)
        {
            if (c.GridI is not { } i || c.GridJ is not { } j || i >= axes.Longitudes.Length || j >= axes.Latitudes.Length) continue;
            double west = Math.Min(lonEdges[i], lonEdges[i + 1]), east = Math.Max(lonEdges[i], lonEdges[i + 1]);
            double south = Math.Min(latEdges[j], latEdges[j + 1]), north = Math.Max(latEdges[j], latEdges[j + 1]);
            var polygon = (Polygon)Wgs84.ToGeometry(new Envelope(west, east, south, north));
            result[c.CellId] = new CellFootprint(c.CellId, c.Longitude, c.Latitude, polygon,
                AuthalicArea.RectangleSquareMetres(west, south, east, north) / 1e6);
        }
        return result;
    }

    public static IReadOnlyDictionary<int, CellFootprint> Voronoi(IReadOnlyList<CellRecord> wet, double spacingMetres)
    {
        var result = new Dictionary<int, CellFootprint>();
        if (wet.Count == 0) return result;
        var meanLatitude = wet.Average(c => c.Latitude);
        var scale = Math.Max(0.05, Math.Cos(meanLatitude * Math.PI / 180));
        var halfSide = spacingMetres / 111_320.0;  // degrees of latitude; common practice: 1 degree of latitude is about 111.32 km

        var byPosition = new Dictionary<(double, double), CellRecord>();
        foreach (var c in wet) byPosition[(c.Longitude * scale, c.Latitude)] = c;
        var builder = new VoronoiDiagramBuilder();
        builder.SetSites(byPosition.Keys.Select(k => new Coordinate(k.Item1, k.Item2)).ToArray());
        var envelope = new Envelope(wet.Min(c => c.Longitude) * scale, wet.Max(c => c.Longitude) * scale, wet.Min(c => c.Latitude), wet.Max(c => c.Latitude));
        envelope.ExpandBy(4 * halfSide);
        builder.ClipEnvelope = envelope;
        var diagram = builder.GetDiagram(Wgs84);
        for (var k = 0; k < diagram.NumGeometries; k++)
        {
            var region = diagram.GetGeometryN(k);
            if (region.UserData is not Coordinate site || !byPosition.TryGetValue((site.X, site.Y), out var cell)) continue;
            var clip = Wgs84.ToGeometry(new Envelope(site.X - halfSide, site.X + halfSide, site.Y - halfSide, site.Y + halfSide));
            if (region.Intersection(clip) is not Polygon clipped || clipped.IsEmpty) continue;
            var ring = clipped.ExteriorRing.Coordinates.Select(p => new Coordinate(p.X / scale, p.Y)).ToArray();
            var polygon = Wgs84.CreatePolygon(ring);
            var area = AuthalicArea.RingSquareMetres(ring[..^1].Select(p => (p.X, p.Y)).ToArray());
            result[cell.CellId] = new CellFootprint(cell.CellId, cell.Longitude, cell.Latitude, polygon, area / 1e6);
        }
        return result;
    }

    // Cell edges halfway between centres; the outer edges lie half a neighbour spacing beyond the end centres.
    private static double[] Edges(double[] centres)
    {
        var edges = new double[centres.Length + 1];
        for (var k = 1; k < centres.Length; k++) edges[k] = (centres[k - 1] + centres[k]) / 2;
        edges[0] = centres[0] - (centres[1] - centres[0]) / 2;
        edges[^1] = centres[^1] + (centres[^1] - centres[^2]) / 2;
        return edges;
    }
}
