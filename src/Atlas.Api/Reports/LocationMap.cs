using SkiaSharp;

namespace Atlas.Api.Reports;

/// <summary>
/// The location map of a report: the dataset's own land mask (its dry cells), the grid's extent, the report's cell and
/// the asked point, in an equirectangular frame scaled by the cosine of the middle latitude, with degree labels and a
/// scale bar. No outside coastline is drawn: the map shows what the hindcast saw.
/// </summary>
public static class LocationMap
{
    private static readonly SKColor Sea = new(0xEE, 0xF2, 0xF5);

    /// <param name="extent">The grid's extent (the outer edges of its cells, <see cref="GridOutline"/>), drawn dashed.</param>
    /// <param name="view">The part of the world the map shows (the extent when null), widened by a small margin.</param>
    /// <param name="fills">Cell footprints filled with a colour (a layer), drawn under the land.</param>
    /// <param name="outlines">Polygons drawn as outlines over everything (an asked area).</param>
    /// <returns>The map's rectangle on the page: the frame's top-left part that keeps the map's proportions.</returns>
    public static SKRect Draw(ReportPage page, SKRect frame, DatasetLand land, (double West, double South, double East, double North) extent,
        IEnumerable<Geometry> outlines, IReadOnlyList<(double Lat, double Lon, string Label, bool Asked)> marks,
        (double West, double South, double East, double North)? view = null, IEnumerable<(Polygon Footprint, SKColor Colour)>? fills = null)
    {
        var canvas = page.Canvas;
        var shown = view ?? extent;
        // A little margin beyond what is shown, so that the dashed extent stays clear of the frame.
        var padLon = Math.Max((shown.East - shown.West) * 0.03, 1e-3);
        var padLat = Math.Max((shown.North - shown.South) * 0.03, 1e-3);
        double west = shown.West - padLon, east = shown.East + padLon, south = shown.South - padLat, north = shown.North + padLat;
        var cos = Math.Cos((south + north) / 2 * Math.PI / 180);
        var scale = Math.Min(frame.Width / ((east - west) * cos), frame.Height / (north - south));
        var width = (float)((east - west) * cos * scale);
        var height = (float)((north - south) * scale);
        var map = new SKRect(frame.Left, frame.Top, frame.Left + width, frame.Top + height);
        SKPoint At(double lat, double lon) => new(map.Left + (float)((lon - west) * cos * scale), map.Top + (float)((north - lat) * scale));

        canvas.Save();
        canvas.ClipRect(map);
        using (var sea = new SKPaint { Color = Sea }) canvas.DrawRect(map, sea);
        using (var fill = new SKPaint { IsAntialias = false })
            foreach (var (footprint, colour) in fills ?? [])
            {
                fill.Color = colour;
                using var path = PathOf(footprint, At);
                canvas.DrawPath(path, fill);
            }
        // Land as the page and the figures draw it (hatched), so it never reads as a value at the light end of the scale.
        foreach (var polygon in land.Polygons)
        {
            using var path = PathOf(polygon, At);
            LandStyle.Draw(canvas, path, map, 3.5f, 0.4f);
        }
        using (var outline = new SKPaint { Color = ReportPage.Ink, IsStroke = true, StrokeWidth = 1.2f, IsAntialias = true })
            foreach (var geometry in outlines)
                for (var k = 0; k < geometry.NumGeometries; k++)
                    if (geometry.GetGeometryN(k) is Polygon polygon)
                    {
                        using var path = PathOf(polygon, At);
                        canvas.DrawPath(path, outline);
                    }
        // The grid's extent (the outer edges of its cells), dashed.
        using (var dashed = new SKPaint { Color = ReportPage.Faint, IsStroke = true, StrokeWidth = 0.6f, PathEffect = SKPathEffect.CreateDash([3, 2], 0) })
            canvas.DrawRect(SKRect.Create(At(extent.North, extent.West), new SKSize(At(extent.South, extent.East).X - At(extent.North, extent.West).X,
                At(extent.South, extent.East).Y - At(extent.North, extent.West).Y)), dashed);
        canvas.Restore();

        using var frameLine = new SKPaint { Color = ReportPage.Ink, IsStroke = true, StrokeWidth = 0.6f };
        canvas.DrawRect(map, frameLine);
        foreach (var (lat, lon, label, asked) in marks)
        {
            var p = At(lat, lon);
            using var mark = new SKPaint { Color = asked ? ReportPage.Ink : ReportCharts.Scale(0.15).ToSKColor(), IsAntialias = true, IsStroke = asked, StrokeWidth = 1.2f };
            if (asked)
            {
                canvas.DrawLine(p.X - 5, p.Y, p.X + 5, p.Y, mark);
                canvas.DrawLine(p.X, p.Y - 5, p.X, p.Y + 5, mark);
            }
            else canvas.DrawCircle(p, 3.2f, mark);
            // The asked point labelled above, the cell below, so that the two never overlap.
            page.Text(label, p.X + 6, asked ? p.Y - 4 : p.Y + 9, page.Fonts.Tiny, ReportPage.Ink);
        }
        Graticule(page, map, west, east, south, north, At);
        ScaleBar(page, map, cos, scale, (south + north) / 2);
        return map;
    }

    private static SKPath PathOf(Polygon polygon, Func<double, double, SKPoint> at)
    {
        using var builder = new SKPathBuilder { FillType = SKPathFillType.EvenOdd };
        foreach (var ring in new[] { polygon.ExteriorRing }.Concat(polygon.InteriorRings))
        {
            var coordinates = ring.Coordinates;
            for (var i = 0; i < coordinates.Length; i++)
            {
                var p = at(coordinates[i].Y, coordinates[i].X);
                if (i == 0) builder.MoveTo(p); else builder.LineTo(p);
            }
            builder.Close();
        }
        return builder.Detach();
    }

    private static void Graticule(ReportPage page, SKRect map, double west, double east, double south, double north, Func<double, double, SKPoint> at)
    {
        var step = ReportNumbers.NiceStep(Math.Max(east - west, north - south) / 4);
        using var tick = new SKPaint { Color = ReportPage.Ink, StrokeWidth = 0.5f };
        for (var lon = Math.Ceiling(west / step) * step; lon <= east; lon += step)
        {
            var x = at(north, lon).X;
            page.Canvas.DrawLine(x, map.Bottom, x, map.Bottom + 3, tick);
            page.Text(Degrees(lon, "E", "W"), x, map.Bottom + 11, page.Fonts.Tiny, ReportPage.Ink, SKTextAlign.Center);
        }
        for (var lat = Math.Ceiling(south / step) * step; lat <= north; lat += step)
        {
            var y = at(lat, west).Y;
            page.Canvas.DrawLine(map.Left - 3, y, map.Left, y, tick);
            page.Text(Degrees(lat, "N", "S"), map.Left - 4, y + 2, page.Fonts.Tiny, ReportPage.Ink, SKTextAlign.Right);
        }
    }

    private static void ScaleBar(ReportPage page, SKRect map, double cos, double pointsPerDegree, double latitude)
    {
        // One degree of longitude at the middle latitude is 111.32 km x cos(latitude) on the sphere; the bar is that close.
        var pointsPerKm = pointsPerDegree * cos / (111.32 * cos);
        var km = ReportNumbers.NiceStep(map.Width / 4 / pointsPerKm);
        var length = (float)(km * pointsPerKm);
        float x = map.Left + 8, y = map.Bottom - 10;
        var label = $"{km.ToString("G4", CultureInfo.InvariantCulture)} km (at {latitude:0.##}° latitude)";
        // On a light ground, so that the bar and its label read over the darkest cells too.
        using (var halo = new SKPaint { Color = new SKColor(0xFF, 0xFF, 0xFF, 0xD8), IsAntialias = true })
            page.Canvas.DrawRoundRect(new SKRect(x - 4, y - 13, x + Math.Max(length, page.Fonts.Tiny.MeasureText(label)) + 4, y + 5), 2, 2, halo);
        using var line = new SKPaint { Color = ReportPage.Ink, StrokeWidth = 1 };
        page.Canvas.DrawLine(x, y, x + length, y, line);
        page.Canvas.DrawLine(x, y - 3, x, y + 3, line);
        page.Canvas.DrawLine(x + length, y - 3, x + length, y + 3, line);
        page.Text(label, x, y - 5, page.Fonts.Tiny, ReportPage.Ink);
    }

    private static string Degrees(double value, string positive, string negative) =>
        $"{Math.Abs(value).ToString("0.##", CultureInfo.InvariantCulture)}°{(value >= 0 ? positive : negative)}";
}
