namespace Atlas.Ingest.Ingestion;

/// <summary>Where one wave variable of a file came from, for the ingest summary and the dataset metadata.</summary>
/// <param name="Name">The file variable.</param>
/// <param name="FoundBy">How it was found, e.g. "standard_name 'depth'".</param>
/// <param name="Conversion">The conversions applied on decoding, or "none".</param>
public sealed record VariableSource(string Name, string FoundBy, string Conversion);
