namespace Atlas.Api.Rasters;

/// <summary>
/// A north-up raster in EPSG:4326 longitude/latitude. Pixel (column, row) covers
/// [West + column * PixelWidth, West + (column + 1) * PixelWidth] x [North - (row + 1) * PixelHeight, North - row * PixelHeight];
/// values are row-major from the north-west corner, NaN where there is no data.
/// </summary>
public sealed class LayerRaster
{
    public LayerRaster(int width, int height, double west, double north, double pixelWidth, double pixelHeight, float[]? values = null)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(width, 1);
        ArgumentOutOfRangeException.ThrowIfLessThan(height, 1);
        if (!(pixelWidth > 0) || !(pixelHeight > 0)) throw new ArgumentOutOfRangeException(nameof(pixelWidth), "Pixel sizes must be positive.");
        Width = width;
        Height = height;
        West = west;
        North = north;
        PixelWidth = pixelWidth;
        PixelHeight = pixelHeight;
        Values = values ?? CreateEmpty(width * height);
        if (Values.Length != width * height) throw new ArgumentException($"Expected {width * height} values, got {Values.Length}.", nameof(values));
    }

    public int Width { get; }
    public int Height { get; }
    public double West { get; }
    public double North { get; }
    public double PixelWidth { get; }
    public double PixelHeight { get; }
    public float[] Values { get; }

    public double East => West + Width * PixelWidth;
    public double South => North - Height * PixelHeight;

    public float this[int column, int row]
    {
        get => Values[row * Width + column];
        set => Values[row * Width + column] = value;
    }

    /// <summary>Longitude of the centre of a column.</summary>
    public double ColumnCentre(int column) => West + (column + 0.5) * PixelWidth;

    /// <summary>Latitude of the centre of a row.</summary>
    public double RowCentre(int row) => North - (row + 0.5) * PixelHeight;

    /// <summary>The finite values' range, or (NaN, NaN) when every pixel is empty.</summary>
    public (double Minimum, double Maximum) Range()
    {
        double min = double.PositiveInfinity, max = double.NegativeInfinity;
        foreach (var v in Values)
        {
            if (float.IsNaN(v)) continue;
            if (v < min) min = v;
            if (v > max) max = v;
        }
        return double.IsInfinity(min) ? (double.NaN, double.NaN) : (min, max);
    }

    /// <summary>
    /// The next coarser overview: each pixel the mean of the finite values of a 2 x 2 block (NaN when all four are
    /// empty); an odd last column or row averages what it has.
    /// </summary>
    public LayerRaster Halve()
    {
        var width = (Width + 1) / 2;
        var height = (Height + 1) / 2;
        var half = new LayerRaster(width, height, West, North, PixelWidth * 2, PixelHeight * 2);
        for (var row = 0; row < height; row++)
        for (var column = 0; column < width; column++)
        {
            double sum = 0;
            var count = 0;
            for (var dy = 0; dy < 2; dy++)
            for (var dx = 0; dx < 2; dx++)
            {
                int c = 2 * column + dx, r = 2 * row + dy;
                if (c >= Width || r >= Height) continue;
                var v = this[c, r];
                if (float.IsNaN(v)) continue;
                sum += v;
                count++;
            }
            half[column, row] = count == 0 ? float.NaN : (float)(sum / count);
        }
        return half;
    }

    private static float[] CreateEmpty(int length)
    {
        var values = new float[length];
        Array.Fill(values, float.NaN);
        return values;
    }
}
