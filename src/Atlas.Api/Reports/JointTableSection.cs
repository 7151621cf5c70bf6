using SkiaSharp;
using static Atlas.Api.Reports.ReportNumbers;

namespace Atlas.Api.Reports;

/// <summary>
/// The joint Hm0-Te table of a site report, twice: the share of time in each bin and the share of energy, each cell
/// coloured along the house scale by its share. Empty rows and columns at the edges are left out.
/// </summary>
public sealed class JointTableSection(SiteReportContent content) : IReportSection
{
    public int Pages => content.Statistics.JointOccurrence is { TotalCount: > 0 } ? 1 : 0;

    public void Draw(ReportPage page, int index)
    {
        var table = content.Statistics.JointOccurrence!;
        page.Heading("Joint occurrence of Hm0 and Te");
        page.Paragraph($"Bins of {Fixed(table.HsBinWidthMetres, 1)} m by {Fixed(table.TeBinWidthSeconds, 0)} s (lower edge included), " +
            $"{table.TotalCount.ToString("N0", CultureInfo.InvariantCulture)} time steps with both Hs and Te. Values are percentages; blank cells hold no step.",
            page.Fonts.Small, colour: ReportPage.Faint);
        var (rows, columns) = Occupied(table);
        var (mostTime, mostEnergy) = (Largest(table.FractionOfTime, rows, columns), Largest(table.FractionOfEnergy, rows, columns));
        page.Subheading("Share of time (%)");
        Grid(page, table, table.FractionOfTime, rows, columns, 300);
        page.Paragraph($"Most frequent sea state: Hs {Bin(table.HsBinLowerEdges[mostTime.Row], table.HsBinWidthMetres, 1)} m, " +
            $"Te {Bin(table.TeBinLowerEdges[mostTime.Column], table.TeBinWidthSeconds, 0)} s, {Percent(table.FractionOfTime[mostTime.Row][mostTime.Column], 2)} of the time.",
            page.Fonts.Small);
        page.Subheading("Share of energy (%)");
        Grid(page, table, table.FractionOfEnergy, rows, columns, 300);
        page.Paragraph($"Sea state carrying the most energy: Hs {Bin(table.HsBinLowerEdges[mostEnergy.Row], table.HsBinWidthMetres, 1)} m, " +
            $"Te {Bin(table.TeBinLowerEdges[mostEnergy.Column], table.TeBinWidthSeconds, 0)} s, {Percent(table.FractionOfEnergy[mostEnergy.Row][mostEnergy.Column], 2)} of the energy.",
            page.Fonts.Small);
    }

    private static string Bin(double lower, double width, int decimals) => $"{Fixed(lower, decimals)}–{Fixed(lower + width, decimals)}";

    /// <summary>The rows and columns between the first and the last that hold a step.</summary>
    private static ((int First, int Last) Rows, (int First, int Last) Columns) Occupied(JointOccurrenceTable table)
    {
        int r0 = int.MaxValue, r1 = -1, c0 = int.MaxValue, c1 = -1;
        for (var r = 0; r < table.Counts.Length; r++)
            for (var c = 0; c < table.Counts[r].Length; c++)
                if (table.Counts[r][c] > 0) (r0, r1, c0, c1) = (Math.Min(r0, r), Math.Max(r1, r), Math.Min(c0, c), Math.Max(c1, c));
        return ((r0, r1), (c0, c1));
    }

    private static (int Row, int Column) Largest(double[][] shares, (int First, int Last) rows, (int First, int Last) columns)
    {
        var best = (Row: rows.First, Column: columns.First);
        for (var r = rows.First; r <= rows.Last; r++)
            for (var c = columns.First; c <= columns.Last; c++)
                if (shares[r][c] > shares[best.Row][best.Column]) best = (r, c);
        return best;
    }

    private static void Grid(ReportPage page, JointOccurrenceTable table, double[][] shares, (int First, int Last) rows, (int First, int Last) columns, float maxHeight)
    {
        var canvas = page.Canvas;
        var columnCount = columns.Last - columns.First + 1;
        var rowCount = rows.Last - rows.First + 1;
        const float labelWidth = 46;
        var cellWidth = Math.Min(34, (ReportPage.ContentWidth - labelWidth) / columnCount);
        var cellHeight = Math.Min(12, (maxHeight - 14) / (rowCount + 1));
        using var font = new SKFont(page.Fonts.Tiny.Typeface, Math.Min(6.4f, cellHeight * 0.62f));
        var largest = 0.0;
        for (var r = rows.First; r <= rows.Last; r++)
            for (var c = columns.First; c <= columns.Last; c++) largest = Math.Max(largest, shares[r][c]);
        var top = page.Y;
        page.Text("Hs m \\ Te s", ReportPage.Margin, top + cellHeight * 0.75f, font, ReportPage.Faint);
        for (var c = columns.First; c <= columns.Last; c++)
            page.Text(Fixed(table.TeBinLowerEdges[c], 0), ReportPage.Margin + labelWidth + (c - columns.First + 0.5f) * cellWidth, top + cellHeight * 0.75f,
                font, ReportPage.Ink, SKTextAlign.Center);
        using var fill = new SKPaint();
        using var grid = new SKPaint { Color = SKColors.White, IsStroke = true, StrokeWidth = 0.5f };
        // Rows from the largest Hs at the top, as the trade draws the table.
        for (var r = rows.Last; r >= rows.First; r--)
        {
            var y = top + cellHeight * (rows.Last - r + 1);
            page.Text(Fixed(table.HsBinLowerEdges[r], 1), ReportPage.Margin + labelWidth - 4, y + cellHeight * 0.75f, font, ReportPage.Ink, SKTextAlign.Right);
            for (var c = columns.First; c <= columns.Last; c++)
            {
                var share = shares[r][c];
                if (table.Counts[r][c] == 0) continue;
                // Darker for more, as tables are read: the house scale runs from dark to light, so it is read from its light end.
                var fraction = 1 - (largest > 0 ? share / largest : 0);
                var (red, green, blue) = ColourScale.At(fraction)!.Value;
                fill.Color = new SKColor(red, green, blue);
                var cell = SKRect.Create(ReportPage.Margin + labelWidth + (c - columns.First) * cellWidth, y, cellWidth, cellHeight);
                canvas.DrawRect(cell, fill);
                canvas.DrawRect(cell, grid);
                var ink = ReportCharts.WhiteReadsBetter(red, green, blue) ? SKColors.White : ReportPage.Ink;
                page.Text(Fixed(100 * share, share >= 0.1 ? 1 : 2), cell.MidX, cell.Top + cellHeight * 0.75f, font, ink, SKTextAlign.Center);
            }
        }
        page.Y = top + cellHeight * (rowCount + 1) + 6;
    }
}
