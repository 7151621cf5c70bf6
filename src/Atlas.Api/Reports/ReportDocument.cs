using SkiaSharp;

namespace Atlas.Api.Reports;

/// <summary>
/// Writes sections as an A4 PDF (SkiaSharp's PDF back end): every page carries the report's running title, its number
/// out of the total, and the caution that an atlas is not a design basis. The document's metadata name the dataset.
/// </summary>
public static class ReportDocument
{
    /// <summary>The PDF bytes of the sections in order.</summary>
    public static byte[] Write(string title, string runningTitle, string subject, IReadOnlyList<IReportSection> sections, DateTime generatedAtUtc)
    {
        using var stream = new MemoryStream();
        var metadata = new SKDocumentPdfMetadata
        {
            Title = title,
            Subject = subject,
            Creator = $"{ProvenanceBuilder.Software} {ProvenanceBuilder.SoftwareVersion}",
            Producer = $"{ProvenanceBuilder.Software} {ProvenanceBuilder.SoftwareVersion}",
            Creation = generatedAtUtc,
            Modified = generatedAtUtc,
            RasterDpi = 150,
        };
        using (var document = SKDocument.CreatePdf(stream, metadata))
        using (var fonts = new ReportFonts())
        {
            var total = sections.Sum(s => s.Pages);
            var number = 0;
            foreach (var section in sections)
                for (var k = 0; k < section.Pages; k++)
                {
                    number++;
                    var canvas = document.BeginPage(ReportPage.Width, ReportPage.Height);
                    var page = new ReportPage(canvas, fonts);
                    Frame(page, runningTitle, number, total);
                    section.Draw(page, k);
                    document.EndPage();
                }
            document.Close();
        }
        return stream.ToArray();
    }

    private static void Frame(ReportPage page, string runningTitle, int number, int total)
    {
        var fonts = page.Fonts;
        page.Text(runningTitle, ReportPage.Margin, 36, fonts.Small, ReportPage.Faint);
        using var rule = new SKPaint { Color = ReportPage.Rule, StrokeWidth = 0.7f, IsStroke = true };
        page.Canvas.DrawLine(ReportPage.Margin, 42, ReportPage.Width - ReportPage.Margin, 42, rule);
        var footTop = ReportPage.Bottom + 14;
        page.Canvas.DrawLine(ReportPage.Margin, footTop, ReportPage.Width - ReportPage.Margin, footTop, rule);
        var y = footTop + 12;
        foreach (var line in ReportPage.Wrap("Caution: " + AtlasCaution.Text, fonts.Small, ReportPage.ContentWidth - 70))
        {
            page.Text(line, ReportPage.Margin, y, fonts.Small, ReportPage.Faint);
            y += 10;
        }
        page.Text($"Page {number} of {total}", ReportPage.Width - ReportPage.Margin, footTop + 12, fonts.Small, ReportPage.Ink, SKTextAlign.Right);
    }
}
