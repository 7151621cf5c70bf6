namespace Atlas.Hindcast;

/// <summary>The shape of the horizontal grid a hindcast is stored on.</summary>
public enum GridKind
{
    /// <summary>1-D latitude and longitude axes (rectilinear; the spacing need not be uniform).</summary>
    Regular,
    /// <summary>2-D latitude and longitude variables named by the data's coordinates attribute.</summary>
    Curvilinear,
    /// <summary>x/y projection axes with a CF grid_mapping, located by 2-D latitude/longitude auxiliary coordinates.</summary>
    Projected,
    /// <summary>UGRID 2-D mesh with data on the nodes.</summary>
    Mesh,
    /// <summary>Output points of a spectral hindcast (CF timeSeries stations), unconnected.</summary>
    Stations,
}

/// <summary>
/// The points a hindcast's values belong to. A point index is row-major <c>j * Nx + i</c> on 2-D grids (j the
/// slower, y/latitude dimension, in file order) and the node index on a mesh. Longitudes are normalised into
/// [-180, 180); latitudes and longitudes are in degrees.
/// </summary>
public abstract class HindcastGrid
{
    private readonly double[] _longitudes;
    private readonly double[] _latitudes;

    protected HindcastGrid(double[] pointLongitudes, double[] pointLatitudes)
    {
        if (pointLongitudes.Length != pointLatitudes.Length)
            throw new ArgumentException("one longitude and one latitude per point are required");
        _longitudes = pointLongitudes;
        for (int p = 0; p < _longitudes.Length; p++) _longitudes[p] = NormaliseLongitude(_longitudes[p]);
        _latitudes = pointLatitudes;
    }

    public abstract GridKind Kind { get; }

    public int PointCount => _longitudes.Length;

    /// <summary>Longitude of every point, degrees east in [-180, 180); NaN where the file gives none.</summary>
    public ReadOnlySpan<double> Longitudes => _longitudes;

    /// <summary>Latitude of every point, degrees north; NaN where the file gives none.</summary>
    public ReadOnlySpan<double> Latitudes => _latitudes;

    public double Longitude(int point) => _longitudes[point];

    public double Latitude(int point) => _latitudes[point];

    /// <summary>
    /// True when <paramref name="other"/> has the same kind and shape and every point lies within
    /// <paramref name="toleranceDegrees"/> of this grid's point (longitudes compared across the antimeridian).
    /// Files of one dataset must agree this way before their series are joined.
    /// </summary>
    public virtual bool IsSameAs(HindcastGrid other, double toleranceDegrees = 1e-5)
    {
        ArgumentNullException.ThrowIfNull(other);
        if (other.Kind != Kind || other.PointCount != PointCount) return false;
        for (int p = 0; p < PointCount; p++)
        {
            if (!Close(_latitudes[p], other._latitudes[p], toleranceDegrees)) return false;
            double a = _longitudes[p], b = other._longitudes[p];
            if (double.IsNaN(a) || double.IsNaN(b))
            {
                if (double.IsNaN(a) != double.IsNaN(b)) return false;
                continue;
            }
            double d = Math.Abs(a - b);
            if (Math.Min(d, 360 - d) > toleranceDegrees) return false;
        }
        return true;
    }

    /// <summary>Maps a longitude into [-180, 180): 180 becomes -180 and 350 becomes -10.</summary>
    public static double NormaliseLongitude(double longitude)
    {
        if (longitude >= -180 && longitude < 180) return longitude;
        double wrapped = longitude + 180 - 360 * Math.Floor((longitude + 180) / 360) - 180;
        return wrapped >= 180 ? wrapped - 360 : wrapped;
    }

    private static bool Close(double a, double b, double tolerance) =>
        double.IsNaN(a) ? double.IsNaN(b) : Math.Abs(a - b) <= tolerance;
}

/// <summary>A 2-D grid of <see cref="Ny"/> rows by <see cref="Nx"/> columns.</summary>
public abstract class StructuredGrid : HindcastGrid
{
    protected StructuredGrid(int nx, int ny, double[] pointLongitudes, double[] pointLatitudes)
        : base(pointLongitudes, pointLatitudes)
    {
        if ((long)nx * ny != pointLongitudes.Length) throw new ArgumentException($"{nx} x {ny} grid needs {nx * ny} points");
        Nx = nx;
        Ny = ny;
    }

    /// <summary>Number of columns (the faster, x/longitude dimension).</summary>
    public int Nx { get; }

    /// <summary>Number of rows (the slower, y/latitude dimension).</summary>
    public int Ny { get; }

    /// <summary>Point index of column <paramref name="i"/>, row <paramref name="j"/>.</summary>
    public int PointIndex(int i, int j) => j * Nx + i;

    public override bool IsSameAs(HindcastGrid other, double toleranceDegrees = 1e-5) =>
        other is StructuredGrid s && s.Nx == Nx && s.Ny == Ny && base.IsSameAs(other, toleranceDegrees);
}
