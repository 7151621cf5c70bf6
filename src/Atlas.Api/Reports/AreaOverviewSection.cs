using SkiaSharp;
using static Atlas.Api.Reports.ReportNumbers;

namespace Atlas.Api.Reports;

/// <summary>
/// The first page of an area report: the polygon on a map of the chosen layer (with its colour bar), the area's
/// statistics, the share of the area above thresholds and the screening result inside it.
/// </summary>
public sealed class AreaOverviewSection(AreaReportContent content) : IReportSection
{
    public int Pages => 1;

    public void Draw(ReportPage page, int index)
    {
        var s = content.Statistics;
        var layer = s.Layer;
        page.Text("Area report", ReportPage.Margin, page.Y + 16, page.Fonts.Title, ReportPage.Ink);
        page.Y += 24;
        page.Paragraph($"{s.Provenance.Title} (dataset {s.Dataset}), generated {content.GeneratedAtUtc.ToString("yyyy-MM-dd HH:mm", CultureInfo.InvariantCulture)} UTC. " +
            $"Layer: {LayerWords(layer)}.", page.Fonts.Body, colour: ReportPage.Faint);

        var values = content.MapCells.Select(c => c.Value).Where(double.IsFinite).ToArray();
        var (low, high) = values.Length == 0 ? (0.0, 1.0) : (values.Min(), values.Max());
        var fills = content.MapCells.Select(c =>
        {
            var (r, g, b) = ColourScale.At(high > low ? (c.Value - low) / (high - low) : 0.5)!.Value;
            return (c.Footprint, new SKColor(r, g, b));
        });
        var top = page.Y + 4;
        var frame = new SKRect(ReportPage.Margin + 26, top, ReportPage.Width - ReportPage.Margin - 70, top + 300);
        var map = LocationMap.Draw(page, frame, content.Land, content.Extent, [content.Area], [], content.View, fills);
        ColourBar(page, new SKRect(map.Right + 16, map.Top + 12, map.Right + 28, map.Top + Math.Min(200, map.Height - 12)), low, high, layer.Units);
        page.Y = top + 318;
        page.Paragraph("Map: the layer's value in each wet cell (house colour scale), the dataset's land mask (its dry cells, hatched), the extent " +
            "of its grid (dashed) and the area (black outline).", page.Fonts.Tiny, colour: ReportPage.Faint);

        page.Heading("Statistics over the cells inside the area");
        page.Table(["quantity", "value"],
        [
            ["area of the polygon", Fixed(s.AreaKm2, 2) + " km²"],
            ["wet cells inside (with a value)", $"{s.CellCount} ({s.CellsWithValue})"],
            ["area of their footprints", Fixed(s.CellAreaKm2, 2) + " km²"],
            ["mean over the cells", Value(s.Mean, layer)],
            ["area-weighted mean", Value(s.AreaWeightedMean, layer)],
            ["minimum / maximum", $"{Value(s.Min, layer)} / {Value(s.Max, layer)}"],
            ["10th / 50th / 90th percentile of the cells", $"{Value(s.P10, layer)} / {Value(s.P50, layer)} / {Value(s.P90, layer)}"],
        ], [250, 180]);

        page.Subheading("Share of the area above thresholds");
        page.Table(["above", "cells", "area km²", "share of the cells' area"],
            content.Thresholds.Select(t => (IReadOnlyList<string>)[Value(t.Threshold, layer), t.Cells.ToString(CultureInfo.InvariantCulture), Fixed(t.AreaKm2, 2), Percent(t.ShareOfCellArea)]),
            [120, 80, 100, 130]);

        var screening = content.Screening;
        page.Subheading("Site screening inside the area");
        page.Paragraph($"Criteria ({SiteOverviewSection.PeriodName(screening.Criteria.Period)}): {Criteria(screening.Criteria)}. " +
            $"{screening.CellsMeeting} of the {screening.CellsInside} wet cells inside meet them, {Fixed(screening.AreaMeetingKm2, 2)} km² " +
            $"({Percent(screening.ShareOfCellArea)} of the cells' area).");
    }

    private static string LayerWords(LayerChoice layer) =>
        $"{layer.Statistic} of {layer.Parameter} ({layer.Units}) over {SiteOverviewSection.PeriodName(AtlasPeriod.TryParse(layer.Period, out var p) ? p : AtlasPeriod.Annual)}";

    /// <summary>A value of the layer in its unit, with two significant decimals for small units and one for power.</summary>
    private static string Value(double? value, LayerChoice layer) => value is { } v ? Fixed(v, layer.Parameter == "j" ? 1 : 2) + " " + layer.Units : NoValue;

    private static string Criteria(ScreeningBounds c)
    {
        var parts = new List<string>();
        if (c.MinPowerKwM is { } p) parts.Add($"mean power at least {Fixed(p, 1)} kW/m");
        if (c.MinDepthM is { } a) parts.Add($"depth at least {Fixed(a, 1)} m");
        if (c.MaxDepthM is { } b) parts.Add($"depth at most {Fixed(b, 1)} m");
        if (c.MaxCoastDistanceKm is { } k) parts.Add($"within {Fixed(k, 1)} km of the coast");
        if (c.MaxHsP90M is { } h) parts.Add($"90th percentile of Hs at most {Fixed(h, 2)} m");
        return parts.Count == 0 ? "none asked, so every wet cell with statistics passes" : string.Join(", ", parts);
    }

    private static void ColourBar(ReportPage page, SKRect bar, double low, double high, string units)
    {
        using var fill = new SKPaint();
        for (var y = 0f; y < bar.Height; y += 1)
        {
            var (r, g, b) = ColourScale.At(1 - y / bar.Height)!.Value;
            fill.Color = new SKColor(r, g, b);
            page.Canvas.DrawRect(bar.Left, bar.Top + y, bar.Width, 1.2f, fill);
        }
        using var line = new SKPaint { Color = ReportPage.Ink, IsStroke = true, StrokeWidth = 0.5f };
        page.Canvas.DrawRect(bar, line);
        page.Text(units, bar.Left, bar.Top - 4, page.Fonts.Tiny, ReportPage.Ink);
        var step = NiceStep((high - low) / 4);
        if (!(step > 0)) return;
        for (var v = Math.Ceiling(low / step) * step; v <= high + 1e-9; v += step)
        {
            var y = bar.Bottom - (float)((v - low) / (high - low) * bar.Height);
            page.Canvas.DrawLine(bar.Right, y, bar.Right + 3, y, line);
            page.Text(v.ToString("G4", CultureInfo.InvariantCulture), bar.Right + 5, y + 2.5f, page.Fonts.Tiny, ReportPage.Ink);
        }
    }
}
