using SkiaSharp;

namespace Atlas.Api.Reports;

/// <summary>
/// The power rose: one wedge per direction sector, its length the share of the energy arriving from that sector (waves
/// coming from), north at the top, clockwise, coloured along the house scale by that share. Drawn on the canvas: the
/// charting library has no rose of sectors.
/// </summary>
public static class PowerRoseChart
{
    public static void Draw(ReportPage page, PowerRose? rose, SKRect box)
    {
        var canvas = page.Canvas;
        page.Text("Power rose: share of energy by direction", box.MidX, box.Top + 12, page.Fonts.Bold, ReportPage.Ink, SKTextAlign.Center);
        if (rose is null || rose.Fractions.Count == 0)
        {
            page.Text("no directions stored", box.MidX, box.MidY, page.Fonts.Small, ReportPage.Faint, SKTextAlign.Center);
            return;
        }
        var centre = new SKPoint(box.MidX, box.MidY + 10);
        var radius = Math.Min(box.Width, box.Height - 40) / 2 - 14;
        var largest = rose.Fractions.Max();
        if (!(largest > 0)) largest = 1;
        using var ring = new SKPaint { Color = ReportPage.Rule, IsStroke = true, StrokeWidth = 0.5f, IsAntialias = true };
        var ringStep = ReportNumbers.NiceStep(largest / 3);
        for (var r = ringStep; r <= largest * 1.0001; r += ringStep)
        {
            var rr = (float)(radius * r / largest);
            canvas.DrawCircle(centre, rr, ring);
            page.Text(ReportNumbers.Percent(r, 0), centre.X + 2, centre.Y - rr - 1, page.Fonts.Tiny, ReportPage.Faint);
        }
        for (var k = 0; k < rose.Sectors; k++)
        {
            var fraction = rose.Fractions[k];
            if (!(fraction > 0)) continue;
            var length = (float)(radius * fraction / largest);
            // Darker for more, as the joint tables are coloured, so the largest sector stands out on the white page
            // (the scale's light end would all but vanish); the smallest keep their outline.
            var (r, g, b) = ColourScale.At(1 - 0.85 * fraction / largest)!.Value;
            using var fill = new SKPaint { Color = new SKColor(r, g, b), IsAntialias = true };
            using var edge = new SKPaint { Color = ReportPage.Ink, IsStroke = true, StrokeWidth = 0.4f, IsAntialias = true };
            // Sector k is centred on k x width degrees from north, clockwise; Skia's angles run clockwise from east.
            var start = (float)(rose.SectorCentresDegrees[k] - rose.SectorWidthDegrees / 2 - 90);
            using var builder = new SKPathBuilder();
            builder.MoveTo(centre);
            builder.ArcTo(new SKRect(centre.X - length, centre.Y - length, centre.X + length, centre.Y + length), start, (float)rose.SectorWidthDegrees, false);
            builder.Close();
            using var path = builder.Detach();
            canvas.DrawPath(path, fill);
            canvas.DrawPath(path, edge);
        }
        foreach (var (label, angle) in new[] { ("N", 0.0), ("E", 90.0), ("S", 180.0), ("W", 270.0) })
        {
            var a = angle * Math.PI / 180;
            page.Text(label, centre.X + (float)((radius + 8) * Math.Sin(a)), centre.Y - (float)((radius + 8) * Math.Cos(a)) + 3, page.Fonts.SmallBold,
                ReportPage.Ink, SKTextAlign.Center);
        }
    }
}
