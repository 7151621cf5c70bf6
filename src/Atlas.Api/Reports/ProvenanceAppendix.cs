using static Atlas.Api.Reports.ReportNumbers;

namespace Atlas.Api.Reports;

/// <summary>
/// The appendix of source files: name, time span and checksum (BLAKE3, or SHA-256 for files loaded before), as many
/// pages as the list needs.
/// </summary>
public sealed class ProvenanceAppendix(Provenance source) : IReportSection
{
    private const int FilesPerPage = 44;

    public int Pages => Math.Max(1, (source.SourceFiles.Count + FilesPerPage - 1) / FilesPerPage);

    public void Draw(ReportPage page, int index)
    {
        page.Heading(index == 0 ? "Appendix: source files" : "Appendix: source files (continued)");
        if (source.SourceFiles.Count == 0)
        {
            page.Paragraph("No source file is recorded for this dataset.");
            return;
        }
        var files = source.SourceFiles.Skip(index * FilesPerPage).Take(FilesPerPage);
        page.Table(["file", "from", "to", "checksum"],
            files.Select(f => (IReadOnlyList<string>)[f.Name, f.TimeStartUtc.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture),
                f.TimeEndUtc.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture), f.Checksum]),
            [122, 48, 48, 293], page.Fonts.Tiny);
    }
}
