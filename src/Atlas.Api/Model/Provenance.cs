namespace Atlas.Api.Model;

/// <summary>Where a figure comes from: carried by every download and every computed response.</summary>
/// <param name="Assumptions">Per wave variable, the file variable it came from, the conversion and what was assumed
/// (the ingest's record in the dataset metadata); empty for a dataset loaded before it was kept.</param>
/// <param name="Warnings">The ingest's warnings about the record (for instance shorter than one month).</param>
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
    string Caution,
    IReadOnlyList<VariableAssumption>? Assumptions = null,
    IReadOnlyList<string>? Warnings = null)
{
    /// <summary>
    /// The assumptions and warnings in one line ("hs: from 'hs' (...); ...; warning: ..."), for the metadata of binary
    /// downloads; says they were not recorded for a dataset loaded before the ingest kept them.
    /// </summary>
    public string AssumptionsText() => Assumptions is { Count: > 0 } assumed
        ? string.Join("; ", assumed.Select(a => a.Describe()).Concat((Warnings ?? []).Select(w => "warning: " + w)))
        : "not recorded (loaded before the ingest kept them)";

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
        foreach (var a in Assumptions ?? []) yield return $"# assumed: {a.Describe()}";
        foreach (var w in Warnings ?? []) yield return $"# warning: {w}";
        if (Licence is not null) yield return $"# licence: {Licence}";
        if (Citation is not null) yield return $"# citation: {Citation}";
        yield return $"# caution: {Caution}";
    }
}

public sealed record ProvenanceFile(string Name, string Sha256, DateTime TimeStartUtc, DateTime TimeEndUtc);

