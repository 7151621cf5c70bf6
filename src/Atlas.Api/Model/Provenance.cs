namespace Atlas.Api.Model;

/// <summary>Where a figure comes from: carried by every download and every computed response.</summary>
public sealed record Provenance(
    string Dataset,
    string Title,
    IReadOnlyList<ProvenanceFile> SourceFiles,
    string Software,
    string SoftwareVersion,
    DateTime? StatisticsComputedAtUtc,
    DateTime GeneratedAtUtc,
    string MethodNotes,
    string? Licence,
    string? Citation,
    string Caution)
{
    /// <summary>The provenance as "# key: value" lines for the head of a text download.</summary>
    public IEnumerable<string> HeaderLines()
    {
        yield return $"# dataset: {Dataset} ({Title})";
        foreach (var file in SourceFiles) yield return $"# source_file: {file.Name} sha256={file.Sha256}";
        if (SourceFiles.Count == 0) yield return "# source_file: none recorded";
        yield return $"# software: {Software} {SoftwareVersion}";
        yield return $"# statistics_computed_at: {(StatisticsComputedAtUtc is { } t ? t.ToString("O") : "not computed")}";
        yield return $"# generated_at: {GeneratedAtUtc:O}";
        yield return $"# method: {MethodNotes}";
        if (Licence is not null) yield return $"# licence: {Licence}";
        if (Citation is not null) yield return $"# citation: {Citation}";
        yield return $"# caution: {Caution}";
    }
}

public sealed record ProvenanceFile(string Name, string Sha256, DateTime TimeStartUtc, DateTime TimeEndUtc);
