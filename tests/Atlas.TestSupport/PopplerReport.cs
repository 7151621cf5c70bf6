using System.Diagnostics;
using System.Text.RegularExpressions;

namespace Atlas.TestSupport;

/// <summary>
/// Reads a PDF back with poppler-utils (Debian's pdfinfo, pdftotext and pdftoppm), the outside reader the report tests
/// hold the reports against, and keeps the file and its rendered pages under tests/artifacts/reports of the checkout to
/// be looked at.
/// </summary>
public sealed partial class PopplerReport
{
    public string PdfPath { get; }
    public int Pages { get; }

    /// <summary>Keeps <paramref name="pdf"/> as tests/artifacts/reports/NAME.pdf and reads its page count.</summary>
    public PopplerReport(byte[] pdf, string name) : this(Keep(pdf, name)) { }

    /// <summary>Reads the PDF at <paramref name="path"/> where it lies.</summary>
    public PopplerReport(string path)
    {
        PdfPath = path;
        var info = Run("pdfinfo", PdfPath);
        Pages = int.Parse(PagesLine().Match(info).Groups[1].Value, System.Globalization.CultureInfo.InvariantCulture);
    }

    /// <summary>The text of one page (1-based): in its physical layout (table rows on one line), or in reading order.</summary>
    public string Page(int number, bool layout = true) =>
        layout ? Run("pdftotext", "-layout", "-f", $"{number}", "-l", $"{number}", PdfPath, "-")
               : Run("pdftotext", "-f", $"{number}", "-l", $"{number}", PdfPath, "-");

    /// <summary>The whole text with runs of whitespace made single spaces (lines joined), for phrases that wrap.</summary>
    public string Flat() => Whitespace().Replace(Run("pdftotext", PdfPath, "-"), " ");

    public static string Flatten(string text) => Whitespace().Replace(text, " ");

    /// <summary>Renders every page as PNG (pdftoppm, 60 dpi) beside the PDF; returns their paths.</summary>
    public IReadOnlyList<string> Render()
    {
        var prefix = Path.ChangeExtension(PdfPath, null);
        Run("pdftoppm", "-r", "60", "-png", PdfPath, prefix);
        return Directory.GetFiles(Path.GetDirectoryName(PdfPath)!, Path.GetFileName(prefix) + "-*.png").Order().ToArray();
    }

    /// <summary>The folder the rendered reports are kept in: tests/artifacts/reports of the checkout.</summary>
    public static string ArtifactFolder
    {
        get
        {
            var folder = Path.Combine(Storage.AtlasHome.FindCheckout(AppContext.BaseDirectory)!, "tests", "artifacts", "reports");
            Directory.CreateDirectory(folder);
            return folder;
        }
    }

    private static string Keep(byte[] pdf, string name)
    {
        var path = Path.Combine(ArtifactFolder, name + ".pdf");
        File.WriteAllBytes(path, pdf);
        return path;
    }

    private static string Run(string program, params string[] arguments)
    {
        var start = new ProcessStartInfo(program) { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        foreach (var a in arguments) start.ArgumentList.Add(a);
        using var process = Process.Start(start) ?? throw new InvalidOperationException($"{program} did not start (apt-get install poppler-utils).");
        var output = process.StandardOutput.ReadToEndAsync();
        var error = process.StandardError.ReadToEndAsync();
        if (!process.WaitForExit(Patience.Limit)) { process.Kill(true); throw new TimeoutException($"{program} took over {Patience.Limit.TotalMinutes} min."); }
        if (process.ExitCode != 0) throw new InvalidOperationException($"{program} {string.Join(' ', arguments)} exited {process.ExitCode}: {error.Result}");
        return output.Result;
    }

    [GeneratedRegex(@"Pages:\s+(\d+)")]
    private static partial Regex PagesLine();

    [GeneratedRegex(@"\s+")]
    private static partial Regex Whitespace();
}
