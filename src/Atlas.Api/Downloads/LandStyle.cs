using SkiaSharp;

namespace Atlas.Api.Downloads;

/// <summary>
/// How land (the dataset's dry cells) looks wherever the atlas draws it: a light stone hatched in a darker one with a
/// brown edge, the colours the page uses (wwwroot/js/main.js), so that land never reads as a value at the light end of
/// the colour scale. The consent figures and the reports' maps draw land through this one place.
/// </summary>
public static class LandStyle
{
    public static readonly SKColor Fill = new(0xD8, 0xD2, 0xC4);
    public static readonly SKColor Hatching = new(0xA3, 0x9A, 0x86);
    public static readonly SKColor Edge = new(0x6F, 0x65, 0x52);

    /// <summary>
    /// Fills <paramref name="land"/> (an even-odd path) and hatches it with lines rising to the right
    /// <paramref name="spacing"/> apart, then strokes its edge <paramref name="edgeWidth"/> wide. Only what lies in
    /// <paramref name="area"/> is hatched.
    /// </summary>
    public static void Draw(SKCanvas canvas, SKPath land, SKRect area, float spacing, float edgeWidth)
    {
        using (var fill = new SKPaint { Color = Fill, IsAntialias = true })
            canvas.DrawPath(land, fill);
        canvas.Save();
        canvas.ClipPath(land, antialias: true);
        Hatch(canvas, area, spacing, edgeWidth);
        canvas.Restore();
        using var edge = new SKPaint { Color = Edge, IsStroke = true, StrokeWidth = edgeWidth, IsAntialias = true };
        canvas.DrawPath(land, edge);
    }

    /// <summary>A legend swatch of land: the fill and hatching of <see cref="Draw"/> in <paramref name="swatch"/>.</summary>
    public static void Swatch(SKCanvas canvas, SKRect swatch, float spacing, float lineWidth)
    {
        using (var fill = new SKPaint { Color = Fill })
            canvas.DrawRect(swatch, fill);
        canvas.Save();
        canvas.ClipRect(swatch);
        Hatch(canvas, swatch, spacing, lineWidth);
        canvas.Restore();
    }

    private static void Hatch(SKCanvas canvas, SKRect area, float spacing, float lineWidth)
    {
        using var hatch = new SKPaint { Color = Hatching, IsStroke = true, StrokeWidth = lineWidth, IsAntialias = true };
        for (var x = area.Left - area.Height; x < area.Right; x += spacing)
            canvas.DrawLine(x, area.Bottom, x + area.Height, area.Top, hatch);
    }
}
