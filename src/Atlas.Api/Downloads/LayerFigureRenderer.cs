using SkiaSharp;

namespace Atlas.Api.Downloads;

/// <summary>
/// A layer as a captioned PNG figure: the map (longitude scaled by the cosine of the mid latitude, so shapes are
/// true near the middle), graticule labels, a colour bar in the layer's unit on <see cref="ColourScale"/>, a scale
/// bar in km, a title, and a caption with the provenance and the caution. Empty pixels are drawn light grey.
/// </summary>
public static class LayerFigureRenderer
{
    private const int MapMaxWidth = 760, MapMaxHeight = 600;
    private const int Left = 64, Top = 64, Right = 130, CaptionTop = 62, CaptionLine = 14;
    private static readonly SKColor NoDataColour = new(0xE4, 0xE4, 0xE1);
    private static readonly SKColor Ink = new(0x22, 0x22, 0x22);

    public static byte[] Render(LayerRaster raster, LayerData data)
    {
        var midLatitude = (raster.North + raster.South) / 2;
        var cos = Math.Max(0.05, Math.Cos(midLatitude * Math.PI / 180));
        var aspect = (raster.East - raster.West) * cos / (raster.North - raster.South);
        double mapWidth = MapMaxWidth, mapHeight = MapMaxWidth / aspect;
        if (mapHeight > MapMaxHeight) { mapHeight = MapMaxHeight; mapWidth = MapMaxHeight * aspect; }
        var width = (int)Math.Ceiling(Left + mapWidth + Right);
        using var typeface = SKTypeface.FromFamilyName("DejaVu Sans") ?? SKTypeface.Default;
        using var small = new SKFont(typeface, 10.5f);
        var caption = Wrap(CaptionLines(data), small, width - 2 * 16).ToArray();
        var height = (int)Math.Ceiling(Top + mapHeight + CaptionTop + caption.Length * CaptionLine + 8);
        var map = new SKRect(Left, Top, (float)(Left + mapWidth), (float)(Top + mapHeight));

        var (min, max) = raster.Range();
        if (min == max) { min -= 0.5; max += 0.5; }

        using var surface = SKSurface.Create(new SKImageInfo(width, height, SKColorType.Rgba8888, SKAlphaType.Premul));
        var canvas = surface.Canvas;
        canvas.Clear(SKColors.White);
        using var titleFont = new SKFont(typeface, 17);
        using var font = new SKFont(typeface, 12);
        using var ink = new SKPaint { Color = Ink, IsAntialias = true };
        using var line = new SKPaint { Color = Ink, IsStroke = true, StrokeWidth = 1, IsAntialias = true };

        using (var image = ImageOf(raster, min, max))
            canvas.DrawImage(image, map, new SKSamplingOptions(SKFilterMode.Nearest), null);
        canvas.DrawRect(map, line);

        canvas.DrawText(data.Title, Left, 26, SKTextAlign.Left, titleFont, ink);
        canvas.DrawText($"{data.Provenance.Title} ({data.Provenance.Dataset})", Left, 46, SKTextAlign.Left, font, ink);

        foreach (var lon in NiceTicks.Between(raster.West, raster.East, 5))
        {
            var x = (float)(map.Left + (lon - raster.West) / (raster.East - raster.West) * map.Width);
            canvas.DrawLine(x, map.Bottom, x, map.Bottom + 4, line);
            canvas.DrawText(Degrees(lon, "E", "W"), x, map.Bottom + 17, SKTextAlign.Center, small, ink);
        }
        foreach (var lat in NiceTicks.Between(raster.South, raster.North, 5))
        {
            var y = (float)(map.Bottom - (lat - raster.South) / (raster.North - raster.South) * map.Height);
            canvas.DrawLine(map.Left - 4, y, map.Left, y, line);
            canvas.DrawText(Degrees(lat, "N", "S"), map.Left - 6, y + 4, SKTextAlign.Right, small, ink);
        }

        DrawColourBar(canvas, new SKRect(map.Right + 24, map.Top, map.Right + 42, map.Bottom), min, max, data.Units, font, small, ink, line);
        DrawScaleBar(canvas, map, raster, cos, small, ink, line);

        var captionTop = map.Bottom + CaptionTop;
        foreach (var text in caption)
        {
            canvas.DrawText(text, 16, captionTop, SKTextAlign.Left, small, ink);
            captionTop += CaptionLine;
        }

        using var snapshot = surface.Snapshot();
        using var png = snapshot.Encode(SKEncodedImageFormat.Png, 100);
        return png.ToArray();
    }

    private static SKImage ImageOf(LayerRaster raster, double min, double max)
    {
        using var bitmap = new SKBitmap(new SKImageInfo(raster.Width, raster.Height, SKColorType.Rgba8888, SKAlphaType.Premul));
        for (var row = 0; row < raster.Height; row++)
        for (var column = 0; column < raster.Width; column++)
        {
            var v = raster[column, row];
            var colour = ColourScale.At((v - min) / (max - min));
            bitmap.SetPixel(column, row, colour is { } c ? new SKColor(c.R, c.G, c.B) : NoDataColour);
        }
        return SKImage.FromBitmap(bitmap);
    }

    private static void DrawColourBar(SKCanvas canvas, SKRect bar, double min, double max, string units, SKFont font, SKFont small, SKPaint ink, SKPaint line)
    {
        using var fill = new SKPaint();
        for (var y = 0; y < (int)bar.Height; y++)
        {
            var c = ColourScale.At(1 - y / (bar.Height - 1))!.Value;
            fill.Color = new SKColor(c.R, c.G, c.B);
            canvas.DrawRect(bar.Left, bar.Top + y, bar.Width, 1.5f, fill);
        }
        canvas.DrawRect(bar, line);
        foreach (var tick in NiceTicks.Between(min, max, 6))
        {
            var y = (float)(bar.Bottom - (tick - min) / (max - min) * bar.Height);
            canvas.DrawLine(bar.Right, y, bar.Right + 4, y, line);
            canvas.DrawText(tick.ToString("G4", CultureInfo.InvariantCulture), bar.Right + 7, y + 4, SKTextAlign.Left, small, ink);
        }
        canvas.DrawText(units, bar.Left, bar.Top - 8, SKTextAlign.Left, font, ink);
    }

    private static void DrawScaleBar(SKCanvas canvas, SKRect map, LayerRaster raster, double cos, SKFont small, SKPaint ink, SKPaint line)
    {
        // Common practice: one degree of longitude is 111.32 km times the cosine of the latitude (spherical approximation).
        var kmPerPixel = (raster.East - raster.West) * 111.32 * cos / map.Width;
        var km = NiceTicks.Round(kmPerPixel * map.Width / 4);
        var length = (float)(km / kmPerPixel);
        var y = map.Bottom + 36;
        var x = map.Left;
        canvas.DrawLine(x, y, x + length, y, line);
        canvas.DrawLine(x, y - 4, x, y + 4, line);
        canvas.DrawLine(x + length, y - 4, x + length, y + 4, line);
        canvas.DrawText($"{km.ToString("G4", CultureInfo.InvariantCulture)} km (at {(raster.North + raster.South) / 2:0.##}° latitude)",
            x + length + 8, y + 4, SKTextAlign.Left, small, ink);
    }

    private static string CaptionLines(LayerData data)
    {
        var p = data.Provenance;
        var files = p.SourceFiles.Count == 0
            ? "no source files recorded"
            : string.Join(", ", p.SourceFiles.Select(f => $"{f.Name} (sha256 {f.Sha256[..Math.Min(12, f.Sha256.Length)]}...)"));
        return $"Dataset {p.Dataset}; sources: {files}. Statistics computed {p.StatisticsComputedAtUtc?.ToString("yyyy-MM-dd HH:mm 'UTC'") ?? "(not recorded)"}; " +
               $"figure by {p.Software} {p.SoftwareVersion} on {p.GeneratedAtUtc:yyyy-MM-dd HH:mm 'UTC'}. {p.MethodNotes}\n{p.Caution}";
    }

    private static IEnumerable<string> Wrap(string text, SKFont font, float width)
    {
        foreach (var paragraph in text.Split('\n'))
        {
            var current = "";
            foreach (var word in paragraph.Split(' ', StringSplitOptions.RemoveEmptyEntries))
            {
                var candidate = current.Length == 0 ? word : current + " " + word;
                if (font.MeasureText(candidate) > width && current.Length > 0)
                {
                    yield return current;
                    current = word;
                }
                else current = candidate;
            }
            if (current.Length > 0) yield return current;
        }
    }

    private static string Degrees(double value, string positive, string negative) =>
        $"{Math.Abs(value).ToString("0.##", CultureInfo.InvariantCulture)}°{(value >= 0 ? positive : negative)}";
}
