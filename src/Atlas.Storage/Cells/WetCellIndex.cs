using Atlas.Hindcast.Geodesy;

namespace Atlas.Storage.Cells;

/// <summary>
/// The wet cells of one dataset held in memory for nearest-cell look-ups: a point query then costs microseconds
/// instead of a database round trip. Cells are placed on the unit sphere (x, y, z) and kept in a k-d tree, so the
/// search is correct across the antimeridian and near the poles; the few candidates within a hair of the nearest
/// chord are ranked by their distance on the WGS 84 ellipsoid, which is also the distance reported.
/// </summary>
public sealed class WetCellIndex
{
    // The ellipsoid can reorder cells whose spherical distances differ by less than its flattening (1/298): every
    // candidate whose chord is within this factor of the nearest is ranked on the ellipsoid.
    private const double CandidateFactor = 1.01;
    private const int LeafSize = 8;

    private readonly CellRecord[] _cells;
    private readonly double[] _x, _y, _z;   // in tree order
    private readonly int[] _order;          // tree position -> index into _cells

    /// <summary>Builds the index of <paramref name="cells"/>' wet members (dry cells are left out).</summary>
    public WetCellIndex(IEnumerable<CellRecord> cells)
    {
        _cells = cells.Where(c => c.Wet).ToArray();
        int n = _cells.Length;
        _order = Enumerable.Range(0, n).ToArray();
        var x = new double[n];
        var y = new double[n];
        var z = new double[n];
        for (int i = 0; i < n; i++) (x[i], y[i], z[i]) = UnitVector(_cells[i].Latitude, _cells[i].Longitude);
        Build(x, y, z, 0, n, 0);
        _x = new double[n];
        _y = new double[n];
        _z = new double[n];
        for (int k = 0; k < n; k++) { _x[k] = x[_order[k]]; _y[k] = y[_order[k]]; _z[k] = z[_order[k]]; }
    }

    /// <summary>The number of wet cells indexed.</summary>
    public int Count => _cells.Length;

    /// <summary>The wet cell nearest the position on the ellipsoid, with its distance in metres; null when there is none.</summary>
    public NearestCell? Nearest(double latitude, double longitude)
    {
        if (_cells.Length == 0) return null;
        var (qx, qy, qz) = UnitVector(latitude, longitude);
        double best = double.PositiveInfinity;
        SearchNearest(0, _cells.Length, 0, qx, qy, qz, ref best);

        var limit = best * CandidateFactor * CandidateFactor;   // squared chords
        NearestCell? nearest = null;
        CollectWithin(0, _cells.Length, 0, qx, qy, qz, limit, (int position) =>
        {
            var cell = _cells[_order[position]];
            var metres = GeodesicDistance.Metres(latitude, longitude, cell.Latitude, cell.Longitude);
            if (nearest is null || metres < nearest.DistanceMetres || (metres == nearest.DistanceMetres && cell.CellId < nearest.Cell.CellId))
                nearest = new NearestCell(cell, metres);
        });
        return nearest;
    }

    private static (double X, double Y, double Z) UnitVector(double latitude, double longitude)
    {
        double phi = latitude * Math.PI / 180, lambda = longitude * Math.PI / 180;
        double c = Math.Cos(phi);
        return (c * Math.Cos(lambda), c * Math.Sin(lambda), Math.Sin(phi));
    }

    // The tree is implicit: the range [start, end) splits at its middle on axis depth % 3, the median's
    // coordinate being the split value; ranges of at most LeafSize cells are scanned.
    private void Build(double[] x, double[] y, double[] z, int start, int end, int depth)
    {
        if (end - start <= LeafSize) return;
        int middle = (start + end) / 2;
        double[] axis = (depth % 3) switch { 0 => x, 1 => y, _ => z };
        SelectMedian(axis, start, end, middle);
        Build(x, y, z, start, middle, depth + 1);
        Build(x, y, z, middle + 1, end, depth + 1);
    }

    /// <summary>
    /// Reorders _order[start..end) so that position <paramref name="middle"/> holds the cell whose coordinate on
    /// <paramref name="axis"/> would be there if the range were sorted, with no larger coordinate before it and no
    /// smaller one after (Hoare's selection: linear on average, so the whole tree builds in n log n).
    /// </summary>
    private void SelectMedian(double[] axis, int start, int end, int middle)
    {
        int low = start, high = end - 1;
        while (low < high)
        {
            double pivot = axis[_order[(low + high) >>> 1]];
            int i = low, j = high;
            while (i <= j)
            {
                while (axis[_order[i]] < pivot) i++;
                while (axis[_order[j]] > pivot) j--;
                if (i <= j) { (_order[i], _order[j]) = (_order[j], _order[i]); i++; j--; }
            }
            if (middle <= j) high = j;
            else if (middle >= i) low = i;
            else return;
        }
    }

    private double Axis(int position, int depth) => (depth % 3) switch { 0 => _x[position], 1 => _y[position], _ => _z[position] };

    private double SquaredChord(int position, double qx, double qy, double qz)
    {
        double dx = _x[position] - qx, dy = _y[position] - qy, dz = _z[position] - qz;
        return dx * dx + dy * dy + dz * dz;
    }

    private void SearchNearest(int start, int end, int depth, double qx, double qy, double qz, ref double best)
    {
        if (end - start <= LeafSize)
        {
            for (int p = start; p < end; p++) best = Math.Min(best, SquaredChord(p, qx, qy, qz));
            return;
        }
        int middle = (start + end) / 2;
        best = Math.Min(best, SquaredChord(middle, qx, qy, qz));
        double q = (depth % 3) switch { 0 => qx, 1 => qy, _ => qz };
        double gap = q - Axis(middle, depth);
        if (gap < 0)
        {
            SearchNearest(start, middle, depth + 1, qx, qy, qz, ref best);
            if (gap * gap < best) SearchNearest(middle + 1, end, depth + 1, qx, qy, qz, ref best);
        }
        else
        {
            SearchNearest(middle + 1, end, depth + 1, qx, qy, qz, ref best);
            if (gap * gap < best) SearchNearest(start, middle, depth + 1, qx, qy, qz, ref best);
        }
    }

    private void CollectWithin(int start, int end, int depth, double qx, double qy, double qz, double limit, Action<int> found)
    {
        if (end - start <= LeafSize)
        {
            for (int p = start; p < end; p++)
                if (SquaredChord(p, qx, qy, qz) <= limit) found(p);
            return;
        }
        int middle = (start + end) / 2;
        if (SquaredChord(middle, qx, qy, qz) <= limit) found(middle);
        double gap = ((depth % 3) switch { 0 => qx, 1 => qy, _ => qz }) - Axis(middle, depth);
        if (gap <= 0 || gap * gap <= limit) CollectWithin(start, middle, depth + 1, qx, qy, qz, limit, found);
        if (gap >= 0 || gap * gap <= limit) CollectWithin(middle + 1, end, depth + 1, qx, qy, qz, limit, found);
    }
}
