using ScottPlot;
using SkiaSharp;

namespace Atlas.Api.Reports;

/// <summary>
/// Charts for reports, drawn by ScottPlot onto the report's PDF canvas (vector, text kept as text) in the house type
/// and with series colours taken from the house colour scale.
/// </summary>
public static class ReportCharts
{
    /// <summary>A new chart in the report's style: the report's font, smaller type than ScottPlot's screen default.</summary>
    public static Plot New(ReportFonts fonts, string title, string xLabel, string yLabel)
    {
        var plot = new Plot();
        plot.Font.Set(fonts.Family);
        plot.Title(title, size: 15);
        plot.XLabel(xLabel, size: 13);
        plot.YLabel(yLabel, size: 13);
        return plot;
    }

    /// <summary>A colour of the house sequential scale at a fraction 0..1.</summary>
    public static Color Scale(double fraction)
    {
        var (r, g, b) = ColourScale.At(fraction)!.Value;
        return new Color(r, g, b);
    }

    /// <summary>
    /// True when white text contrasts more than black with a background of these sRGB bytes (WCAG 2 relative luminance
    /// and contrast ratio), the rule the page's tables use (wwwroot/js/colour-scale.js, textColourOn).
    /// </summary>
    public static bool WhiteReadsBetter(byte red, byte green, byte blue)
    {
        static double Linear(byte v) => v / 255.0 <= 0.04045 ? v / 255.0 / 12.92 : Math.Pow((v / 255.0 + 0.055) / 1.055, 2.4);
        var luminance = 0.2126 * Linear(red) + 0.7152 * Linear(green) + 0.0722 * Linear(blue);
        return 1.05 / (luminance + 0.05) > (luminance + 0.05) / 0.05;
    }

    /// <summary>How much smaller than ScottPlot's screen sizes the charts' type and lines are drawn on a page.</summary>
    private const float Reduction = 0.62f;

    /// <summary>
    /// Draws the chart into <paramref name="area"/> of the page (points): laid out on a larger area at the origin and
    /// scaled down into place, so that its type and lines shrink with it, and clipped to the area.
    /// </summary>
    public static void Draw(ReportPage page, Plot plot, SKRect area)
    {
        var canvas = page.Canvas;
        canvas.Save();
        canvas.ClipRect(area);
        canvas.Translate(area.Left, area.Top);
        canvas.Scale(Reduction);
        plot.Render(canvas, new PixelRect(0, area.Width / Reduction, area.Height / Reduction, 0));
        canvas.Restore();
    }

    /// <summary>The house scale as a ScottPlot colour map, for heat maps (a 2-D histogram).</summary>
    public sealed class HouseColormap : IColormap
    {
        public string Name => "house sequential";
        public Color GetColor(double normalizedIntensity) => Scale(normalizedIntensity);
    }
}
