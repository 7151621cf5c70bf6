using System.Text.RegularExpressions;
using Atlas.Api.Tests.Support;

namespace Atlas.Api.Tests.Reports;

/// <summary>
/// Reads a PDF back with poppler-utils (Debian's pdfinfo, pdftotext and pdftoppm), the outside reader the report tests
/// hold the reports against, and keeps the file and its rendered pages under tests/artifacts/reports to be looked at.
/// </summary>
public sealed partial class ReportReader
{
    public string PdfPath { get; }
    public int Pages { get; }

    public ReportReader(byte[] pdf, string name)
    {
        var folder = Path.Combine(Assessment.AssessmentAtlas.Checkout, "tests", "artifacts", "reports");
        Directory.CreateDirectory(folder);
        PdfPath = Path.Combine(folder, name + ".pdf");
        File.WriteAllBytes(PdfPath, pdf);
        var info = ExternalTool.Run("pdfinfo", PdfPath);
        Pages = int.Parse(PagesLine().Match(info).Groups[1].Value, System.Globalization.CultureInfo.InvariantCulture);
    }

    /// <summary>The text of one page (1-based): in its physical layout (table rows on one line), or in reading order.</summary>
    public string Page(int number, bool layout = true) =>
        layout ? ExternalTool.Run("pdftotext", "-layout", "-f", $"{number}", "-l", $"{number}", PdfPath, "-")
               : ExternalTool.Run("pdftotext", "-f", $"{number}", "-l", $"{number}", PdfPath, "-");

    /// <summary>The whole text with runs of whitespace made single spaces (lines joined), for phrases that wrap.</summary>
    public string Flat() => Whitespace().Replace(ExternalTool.Run("pdftotext", PdfPath, "-"), " ");

    public static string Flatten(string text) => Whitespace().Replace(text, " ");

    /// <summary>Renders every page as PNG (pdftoppm, 60 dpi) beside the PDF; returns their paths.</summary>
    public IReadOnlyList<string> Render()
    {
        var prefix = Path.ChangeExtension(PdfPath, null);
        ExternalTool.Run("pdftoppm", "-r", "60", "-png", PdfPath, prefix);
        return Directory.GetFiles(Path.GetDirectoryName(PdfPath)!, Path.GetFileName(prefix) + "-*.png").Order().ToArray();
    }

    [GeneratedRegex(@"Pages:\s+(\d+)")]
    private static partial Regex PagesLine();

    [GeneratedRegex(@"\s+")]
    private static partial Regex Whitespace();
}
