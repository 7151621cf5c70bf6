namespace Atlas.Api.Rasters;

/// <summary>
/// Draws cell values onto a north-up longitude/latitude raster. A regular grid with evenly spaced axes maps each
/// cell to one pixel through its grid_i and grid_j. Anything else (a mesh, a curvilinear or projected grid, uneven
/// axes) is drawn by linear interpolation inside triangles whose three corners all have values: the mesh's own
/// triangles, or each grid quad split in two. Pixels outside every such triangle stay empty (NaN), so values are
/// never carried across land or beyond the mesh.
/// </summary>
public static class LayerRasteriser
{
    public static LayerRaster OnRegularGrid(GridAxes axes, IReadOnlyList<LayerValue> values)
    {
        if (!axes.IsUniform) throw new ArgumentException("The grid axes are not evenly spaced; draw the layer by triangles.", nameof(axes));
        var lon = axes.Longitudes;
        var lat = axes.Latitudes;
        var dx = axes.LongitudeSpacing;
        var dy = axes.LatitudeSpacing;
        var lonAscending = lon[^1] > lon[0];
        var latAscending = lat[^1] > lat[0];
        var raster = new LayerRaster(lon.Length, lat.Length, Math.Min(lon[0], lon[^1]) - dx / 2, Math.Max(lat[0], lat[^1]) + dy / 2, dx, dy);
        foreach (var v in values)
        {
            if (v.GridI is not { } i || v.GridJ is not { } j || i < 0 || j < 0 || i >= lon.Length || j >= lat.Length) continue;
            var column = lonAscending ? i : lon.Length - 1 - i;
            var row = latAscending ? lat.Length - 1 - j : j;
            raster[column, row] = (float)v.Value;
        }
        return raster;
    }

    /// <summary>
    /// Triangles over a structured grid: each quad (i, j), (i+1, j), (i+1, j+1), (i, j+1) split along one diagonal,
    /// as cell ids; a triangle is kept only when its three cells are in <paramref name="values"/>.
    /// </summary>
    public static IReadOnlyList<(int A, int B, int C)> GridTriangles(IReadOnlyList<LayerValue> values)
    {
        var byIndex = new Dictionary<(int, int), int>();
        foreach (var v in values)
            if (v.GridI is { } i && v.GridJ is { } j) byIndex[(i, j)] = v.CellId;
        var triangles = new List<(int, int, int)>();
        foreach (var ((i, j), a) in byIndex)
        {
            var hasB = byIndex.TryGetValue((i + 1, j), out var b);
            var hasC = byIndex.TryGetValue((i + 1, j + 1), out var c);
            var hasD = byIndex.TryGetValue((i, j + 1), out var d);
            if (hasB && hasC) triangles.Add((a, b, c));
            if (hasC && hasD) triangles.Add((a, c, d));
            // Where the quad's far corner is missing, the other diagonal still covers the half that has data.
            if (!hasC && hasB && hasD) triangles.Add((a, b, d));
        }
        return triangles;
    }

    /// <summary>
    /// Linear interpolation on triangles (cell ids into <paramref name="values"/>). Pixels are square in degrees,
    /// about a quarter of the median triangle edge, and at most <paramref name="maxPixels"/> per side.
    /// </summary>
    public static LayerRaster OnTriangles(IReadOnlyList<LayerValue> values, IReadOnlyList<(int A, int B, int C)> triangles, int maxPixels)
    {
        var byId = new Dictionary<int, CoordinateZ>(values.Count);
        foreach (var v in values) byId[v.CellId] = new CoordinateZ(v.Longitude, v.Latitude, v.Value);
        var usable = new List<(CoordinateZ A, CoordinateZ B, CoordinateZ C)>(triangles.Count);
        foreach (var (a, b, c) in triangles)
            if (byId.TryGetValue(a, out var pa) && byId.TryGetValue(b, out var pb) && byId.TryGetValue(c, out var pc)
                && !double.IsNaN(pa.Z) && !double.IsNaN(pb.Z) && !double.IsNaN(pc.Z))
                usable.Add((pa, pb, pc));
        if (usable.Count == 0) throw new ArgumentException("No triangle has values at all three corners.", nameof(triangles));

        double west = double.MaxValue, east = double.MinValue, south = double.MaxValue, north = double.MinValue;
        var edges = new List<double>(3 * usable.Count);
        foreach (var (a, b, c) in usable)
        {
            foreach (var p in new[] { a, b, c })
            {
                west = Math.Min(west, p.X); east = Math.Max(east, p.X);
                south = Math.Min(south, p.Y); north = Math.Max(north, p.Y);
            }
            edges.Add(a.Distance(b));
            edges.Add(b.Distance(c));
            edges.Add(c.Distance(a));
        }
        edges.Sort();
        var pixel = Math.Max(edges[edges.Count / 2] / 4, Math.Max(east - west, north - south) / maxPixels);
        if (!(pixel > 0)) pixel = 1e-6;
        var width = Math.Clamp((int)Math.Ceiling((east - west) / pixel), 1, maxPixels);
        var height = Math.Clamp((int)Math.Ceiling((north - south) / pixel), 1, maxPixels);
        var raster = new LayerRaster(width, height, west, north, pixel, pixel);

        foreach (var (a, b, c) in usable)
        {
            var firstColumn = Math.Max(0, (int)Math.Floor((Math.Min(a.X, Math.Min(b.X, c.X)) - west) / pixel - 0.5));
            var lastColumn = Math.Min(width - 1, (int)Math.Ceiling((Math.Max(a.X, Math.Max(b.X, c.X)) - west) / pixel - 0.5));
            var firstRow = Math.Max(0, (int)Math.Floor((north - Math.Max(a.Y, Math.Max(b.Y, c.Y))) / pixel - 0.5));
            var lastRow = Math.Min(height - 1, (int)Math.Ceiling((north - Math.Min(a.Y, Math.Min(b.Y, c.Y))) / pixel - 0.5));
            var area = (b.X - a.X) * (c.Y - a.Y) - (c.X - a.X) * (b.Y - a.Y);
            if (area == 0) continue;
            for (var row = firstRow; row <= lastRow; row++)
            for (var column = firstColumn; column <= lastColumn; column++)
            {
                var p = new Coordinate(raster.ColumnCentre(column), raster.RowCentre(row));
                if (!Inside(p, a, b, c, area)) continue;
                raster[column, row] = (float)Triangle.InterpolateZ(p, a, b, c);
            }
        }
        return raster;
    }

    // Barycentric signs with a small tolerance, so that pixel centres on a shared edge are drawn by one of the two.
    private static bool Inside(Coordinate p, Coordinate a, Coordinate b, Coordinate c, double area)
    {
        const double tolerance = -1e-12;
        var w0 = ((b.X - p.X) * (c.Y - p.Y) - (c.X - p.X) * (b.Y - p.Y)) / area;
        var w1 = ((c.X - p.X) * (a.Y - p.Y) - (a.X - p.X) * (c.Y - p.Y)) / area;
        var w2 = 1 - w0 - w1;
        return w0 >= tolerance && w1 >= tolerance && w2 >= tolerance;
    }
}
