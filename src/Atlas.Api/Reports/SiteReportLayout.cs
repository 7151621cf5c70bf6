namespace Atlas.Api.Reports;

/// <summary>The order of a site report's sections.</summary>
public static class SiteReportLayout
{
    public static byte[] Write(SiteReportContent content)
    {
        var s = content.Statistics;
        IReportSection[] sections =
        [
            new SiteOverviewSection(content),
            new SiteChartsSection(content),
            new SpectralSection(content),
            new TimeSeriesSection(content),
            new JointTableSection(content),
            new ValidationSection(content),
            new AssessmentSection(content),
            MethodSection.For(content),
            new ProvenanceAppendix(s.Provenance),
        ];
        var place = ReportNumbers.Position(s.Cell.Lat, s.Cell.Lon);
        return ReportDocument.Write($"Site report: {s.Provenance.Title}, {place}", $"Site report · {s.Provenance.Title} ({s.Dataset}) · cell {s.Cell.Id}, {place}",
            $"Wave-resource statistics at cell {s.Cell.Id} of dataset {s.Dataset}", sections, content.GeneratedAtUtc);
    }
}
