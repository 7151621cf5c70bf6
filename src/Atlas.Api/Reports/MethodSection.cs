namespace Atlas.Api.Reports;

/// <summary>
/// Method notes, what was assumed when the files were loaded, warnings, licence and the citation line, in words (the
/// keys and option values the provenance carries read as words here), running on over as many pages as they need.
/// </summary>
public static class MethodSection
{
    public static FlowSection For(SiteReportContent content)
    {
        var source = content.Statistics.Provenance;
        var blocks = new List<FlowBlock>
        {
            new(FlowBlockKind.Heading, "Method notes"),
            new(FlowBlockKind.Paragraph, PlainWords.Of(source.MethodNotes)),
            new(FlowBlockKind.Paragraph, $"Percentiles at a point are exact, from the sorted series ({PlainWords.Of(content.Statistics.QuantileDefinition.ToString())}). " +
                (content.Statistics.DeepWaterAssumed ? "The cell's depth is unknown, so deep water was assumed for the group velocity. " : "") +
                (content.Statistics.EnergyPeriodSource == EnergyPeriodSource.Provided ? "" : "The dataset stores no energy period: Te was derived from the peak period. ")),
            new(FlowBlockKind.Heading, "What was assumed when the files were loaded"),
        };
        if (source.Assumptions is { Count: > 0 } assumed)
            blocks.AddRange(assumed.Select(a => new FlowBlock(FlowBlockKind.Small, "• " + PlainWords.Of(a.Describe()))));
        else blocks.Add(new(FlowBlockKind.Paragraph, "Not recorded: the dataset was loaded before the ingest kept its assumptions."));
        blocks.AddRange((source.Warnings ?? []).Select(w => new FlowBlock(FlowBlockKind.Small, "Warning: " + w)));
        blocks.Add(new(FlowBlockKind.Heading, "Provenance and citation"));
        blocks.Add(new(FlowBlockKind.Paragraph, $"Computed by {source.Software} {source.SoftwareVersion}; statistics computed " +
            $"{(source.StatisticsComputedAtUtc is { } t ? t.ToString("yyyy-MM-dd HH:mm", CultureInfo.InvariantCulture) + " UTC" : "not recorded")}; " +
            $"{source.SourceFiles.Count} source file(s), listed with their SHA-256 checksums in the appendix."));
        if (source.Licence is { } licence) blocks.Add(new(FlowBlockKind.Paragraph, "Licence: " + licence));
        blocks.Add(new(FlowBlockKind.Emphasis, "Cite as: " + Citation(content)));
        blocks.Add(new(FlowBlockKind.Heading, "Caution"));
        blocks.Add(new(FlowBlockKind.Paragraph, source.Caution));
        return new FlowSection(blocks);
    }

    /// <summary>The dataset's own citation when it has one, else one made of its title, the software and the date.</summary>
    public static string Citation(SiteReportContent content)
    {
        var source = content.Statistics.Provenance;
        var cell = content.Statistics.Cell;
        var own = source.Citation is { } c ? c + ". " : $"{source.Title} (dataset {source.Dataset}). ";
        return own + $"Site report for {ReportNumbers.Position(cell.Lat, cell.Lon)} " +
            $"(cell {cell.Id}), {source.Software} {source.SoftwareVersion}, generated {content.GeneratedAtUtc:yyyy-MM-dd}.";
    }
}
