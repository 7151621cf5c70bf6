namespace Atlas.Demo;

/// <summary>
/// The regular latitude/longitude grid laid over <see cref="CoastGeometry.Bounds"/>: cell centres,
/// the land mask, and for each wet cell its depth, local position and distance to the shore. Latitudes ascend (south to north), longitudes ascend (west to east);
/// a cell's flat index is <c>row * Columns + column</c>.
/// </summary>
public sealed class DemoGrid
{
    // Coast points are sampled on a fixed raster so that distances and shore directions do not
    // depend on the grid resolution; the raster runs past the box so the mainland beyond the
    // north and south edges still counts as shore.
    private const double CoastRasterKm = 1.0;
    private const double CoastRasterMarginKm = 60.0;

    /// <summary>Number of longitudes.</summary>
    public int Columns { get; }

    /// <summary>Number of latitudes.</summary>
    public int Rows { get; }

    /// <summary>Cell-centre longitudes, degrees east, ascending.</summary>
    public double[] Longitudes { get; }

    /// <summary>Cell-centre latitudes, degrees north, ascending.</summary>
    public double[] Latitudes { get; }

    /// <summary>True for each land cell, by flat index.</summary>
    public bool[] IsLand { get; }

    /// <summary>Flat indices of the wet cells, ascending; wet cell k is <c>WetCells[k]</c>.</summary>
    public int[] WetCells { get; }

    /// <summary>Depth of each wet cell, m (positive down).</summary>
    public double[] DepthMetres { get; }

    /// <summary>Local x of each wet cell, km east of the west edge.</summary>
    public double[] XKm { get; }

    /// <summary>Local y of each wet cell, km north of the south edge.</summary>
    public double[] YKm { get; }

    /// <summary>Distance of each wet cell to the nearest shore, km (at least 0.5).</summary>
    public double[] ShoreDistanceKm { get; }

    /// <summary>Builds the grid and its per-cell geometry.</summary>
    public DemoGrid(int columns, int rows)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(columns, 2);
        ArgumentOutOfRangeException.ThrowIfLessThan(rows, 2);
        Columns = columns;
        Rows = rows;
        var box = CoastGeometry.Bounds;
        double dLon = (box.East - box.West) / columns, dLat = (box.North - box.South) / rows;
        Longitudes = new double[columns];
        Latitudes = new double[rows];
        for (int i = 0; i < columns; i++) Longitudes[i] = Math.Round(box.West + (i + 0.5) * dLon, 10);
        for (int j = 0; j < rows; j++) Latitudes[j] = Math.Round(box.South + (j + 0.5) * dLat, 10);

        IsLand = new bool[columns * rows];
        var wet = new List<int>();
        for (int j = 0; j < rows; j++)
        {
            double y = CoastGeometry.YKm(Latitudes[j]);
            for (int i = 0; i < columns; i++)
            {
                bool land = CoastGeometry.IsLand(CoastGeometry.XKm(Longitudes[i]), y);
                IsLand[j * columns + i] = land;
                if (!land) wet.Add(j * columns + i);
            }
        }
        WetCells = [.. wet];

        var coast = SampleCoastPoints();
        int n = WetCells.Length;
        DepthMetres = new double[n];
        XKm = new double[n];
        YKm = new double[n];
        ShoreDistanceKm = new double[n];
        for (int k = 0; k < n; k++)
        {
            int cell = WetCells[k];
            double x = CoastGeometry.XKm(Longitudes[cell % columns]);
            double y = CoastGeometry.YKm(Latitudes[cell / columns]);
            XKm[k] = x;
            YKm[k] = y;
            double distance = ShoreDistance(coast, x, y);
            ShoreDistanceKm[k] = distance;
            DepthMetres[k] = Math.Round(CoastGeometry.DepthMetres(distance, x, y), 1);
        }
    }

    /// <summary>Number of wet cells.</summary>
    public int WetCount => WetCells.Length;

    /// <summary>Index k into the wet-cell arrays of the wet cell nearest (in km) to a point.</summary>
    public int NearestWetCell(double latitude, double longitude) =>
        NearestWetCellKm(CoastGeometry.XKm(longitude), CoastGeometry.YKm(latitude));

    /// <summary>Index k of the wet cell nearest to a point of the local frame (km).</summary>
    public int NearestWetCellKm(double x, double y)
    {
        int best = -1;
        double bestDistance = double.PositiveInfinity;
        for (int k = 0; k < WetCells.Length; k++)
        {
            double dx = XKm[k] - x, dy = YKm[k] - y, d = dx * dx + dy * dy;
            if (d < bestDistance) { bestDistance = d; best = k; }
        }
        return best;
    }

    /// <summary>Longitude of wet cell k.</summary>
    public double LongitudeOf(int k) => Longitudes[WetCells[k] % Columns];

    /// <summary>Latitude of wet cell k.</summary>
    public double LatitudeOf(int k) => Latitudes[WetCells[k] / Columns];

    private static List<(double X, double Y)> SampleCoastPoints()
    {
        var points = new List<(double, double)>();
        double xMax = CoastGeometry.XKm(CoastGeometry.Bounds.East) + CoastRasterMarginKm;
        double yMin = -CoastRasterMarginKm, yMax = CoastGeometry.YKm(CoastGeometry.Bounds.North) + CoastRasterMarginKm;
        for (double y = yMin; y <= yMax; y += CoastRasterKm)
        {
            for (double x = CoastGeometry.WesternmostLandXKm - 2 * CoastRasterKm; x <= xMax; x += CoastRasterKm)
            {
                if (!CoastGeometry.IsLand(x, y)) continue;
                if (!CoastGeometry.IsLand(x - CoastRasterKm, y) || !CoastGeometry.IsLand(x + CoastRasterKm, y)
                    || !CoastGeometry.IsLand(x, y - CoastRasterKm) || !CoastGeometry.IsLand(x, y + CoastRasterKm))
                    points.Add((x, y));
            }
        }
        return points;
    }

    // Distance to the nearest sampled shore point, less half the raster step (the shore lies
    // between the last sea and the first land sample).
    private static double ShoreDistance(List<(double X, double Y)> coast, double x, double y)
    {
        double nearest = double.PositiveInfinity;
        foreach (var (px, py) in coast)
        {
            double dx = x - px, dy = y - py;
            nearest = Math.Min(nearest, dx * dx + dy * dy);
        }
        return Math.Max(0.5, Math.Sqrt(nearest) - 0.5 * CoastRasterKm);
    }
}
