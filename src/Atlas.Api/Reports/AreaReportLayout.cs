namespace Atlas.Api.Reports;

/// <summary>The order of an area report's sections.</summary>
public static class AreaReportLayout
{
    public static byte[] Write(AreaReportContent content)
    {
        var s = content.Statistics;
        var envelope = content.Area.EnvelopeInternal;
        var place = $"{ReportNumbers.Position(envelope.MinY, envelope.MinX, 3)} to {ReportNumbers.Position(envelope.MaxY, envelope.MaxX, 3)}";
        IReportSection[] sections =
        [
            new AreaOverviewSection(content),
            MethodSection.For(s.Provenance, [s.Method], MethodSection.Citation(s.Provenance, $"Area report for the polygon within {place}", content.GeneratedAtUtc)),
            new ProvenanceAppendix(s.Provenance),
        ];
        return ReportDocument.Write($"Area report: {s.Provenance.Title}, {place}", $"Area report · {s.Provenance.Title} ({s.Dataset}) · {place}",
            $"Statistics of the layer {s.Layer.Parameter} {s.Layer.Statistic} {s.Layer.Period} over an area of dataset {s.Dataset}", sections, content.GeneratedAtUtc);
    }
}
