namespace Atlas.Api.Reports;

/// <summary>
/// Method notes, what was assumed when the files were loaded, warnings, licence and the citation line, in words (the
/// keys and option values the provenance carries read as words here), running on over as many pages as they need.
/// </summary>
public static class MethodSection
{
    /// <summary>The site report's notes: the dataset's, then how the point's percentiles, depth and energy period were taken.</summary>
    public static FlowSection For(SiteReportContent content) => For(content.Statistics.Provenance,
        [$"Percentiles at a point are exact, from the sorted series ({PlainWords.Of(content.Statistics.QuantileDefinition.ToString())}). " +
            (content.Statistics.DeepWaterAssumed ? "The cell's depth is unknown, so deep water was assumed for the group velocity. " : "") +
            (content.Statistics.EnergyPeriodSource == EnergyPeriodSource.Provided ? "" : "The dataset stores no energy period: Te was derived from the peak period. ")],
        Citation(content.Statistics.Provenance, $"Site report for {ReportNumbers.Position(content.Statistics.Cell.Lat, content.Statistics.Cell.Lon)} (cell {content.Statistics.Cell.Id})",
            content.GeneratedAtUtc));

    /// <summary>The dataset's method notes, then <paramref name="notes"/>, the ingest's assumptions and warnings, provenance, citation and caution.</summary>
    public static FlowSection For(Provenance source, IEnumerable<string> notes, string citation)
    {
        var blocks = new List<FlowBlock>
        {
            new(FlowBlockKind.Heading, "Method notes"),
            new(FlowBlockKind.Paragraph, PlainWords.Of(source.MethodNotes)),
        };
        blocks.AddRange(notes.Select(n => new FlowBlock(FlowBlockKind.Paragraph, PlainWords.Of(n))));
        blocks.Add(new(FlowBlockKind.Heading, "What was assumed when the files were loaded"));
        if (source.Assumptions is { Count: > 0 } assumed)
            blocks.AddRange(assumed.Select(a => new FlowBlock(FlowBlockKind.Small, "• " + PlainWords.Of(a.Describe()))));
        else blocks.Add(new(FlowBlockKind.Paragraph, "Not recorded: the dataset was loaded before the ingest kept its assumptions."));
        blocks.AddRange((source.Warnings ?? []).Select(w => new FlowBlock(FlowBlockKind.Small, "Warning: " + w)));
        blocks.Add(new(FlowBlockKind.Heading, "Provenance and citation"));
        blocks.Add(new(FlowBlockKind.Paragraph, $"Computed by {source.Software} {source.SoftwareVersion}; statistics computed " +
            $"{(source.StatisticsComputedAtUtc is { } t ? t.ToString("yyyy-MM-dd HH:mm", CultureInfo.InvariantCulture) + " UTC" : "not recorded")}; " +
            $"{source.SourceFiles.Count} source file(s), listed with their checksums in the appendix " +
            "(blake3: as b3sum prints it, sha256: as sha256sum does)."));
        if (source.Licence is { } licence) blocks.Add(new(FlowBlockKind.Paragraph, "Licence: " + licence));
        blocks.Add(new(FlowBlockKind.Emphasis, "Cite as: " + citation));
        blocks.Add(new(FlowBlockKind.Heading, "Caution"));
        blocks.Add(new(FlowBlockKind.Paragraph, source.Caution));
        return new FlowSection(blocks);
    }

    /// <summary>The dataset's own citation when it has one, else its title; then what the report shows, the software and the date.</summary>
    public static string Citation(Provenance source, string what, DateTime generatedAtUtc)
    {
        var own = source.Citation is { } c ? c + ". " : $"{source.Title} (dataset {source.Dataset}). ";
        return own + $"{what}, {source.Software} {source.SoftwareVersion}, generated {generatedAtUtc.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture)}.";
    }
}
