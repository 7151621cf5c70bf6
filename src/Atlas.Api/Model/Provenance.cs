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

    /// <summary>
    /// The source files with their checksums in one line ("a.nc blake3:…; b.nc sha256:…"), for the metadata of
    /// binary downloads and figures.
    /// </summary>
    public string SourceFilesText() => SourceFiles.Count == 0
        ? "no source files recorded"
        : string.Join("; ", SourceFiles.Select(f => $"{f.Name} {f.Checksum}"));
}

/// <param name="Checksum">The file's checksum with its algorithm's name: <c>blake3:</c> (as <c>b3sum</c> prints it) or, for
/// files loaded before BLAKE3, <c>sha256:</c> (as <c>sha256sum</c> prints it), then 64 hexadecimal digits.</param>
public sealed record ProvenanceFile(string Name, string Checksum, DateTime TimeStartUtc, DateTime TimeEndUtc);

