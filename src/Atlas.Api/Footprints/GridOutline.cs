namespace Atlas.Api.Footprints;

/// <summary>
/// The extent of a dataset's grid as a map outlines it: the outer edges of all its cells, the wet cells' footprints
/// and the land mask's dry cells together, so that the outline goes round the whole grid and never cuts through an
/// edge cell or through land at the grid's edge (the page draws the same box).
/// </summary>
public static class GridOutline
{
    /// <summary>West, south, east and north in degrees; <paramref name="fallback"/> (cell centres) when there is no footprint.</summary>
    public static (double West, double South, double East, double North) Of(IEnumerable<CellFootprint> wet, DatasetLand land,
        (double West, double South, double East, double North) fallback)
    {
        var box = new Envelope();
        foreach (var cell in wet) box.ExpandToInclude(cell.Polygon.EnvelopeInternal);
        if (land.Land is { } shape) box.ExpandToInclude(shape.EnvelopeInternal);
        return box.IsNull ? fallback : (box.MinX, box.MinY, box.MaxX, box.MaxY);
    }
}
