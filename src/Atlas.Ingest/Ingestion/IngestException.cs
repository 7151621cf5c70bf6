namespace Atlas.Ingest.Ingestion;

/// <summary>An ingest refused for a reason the user can fix; the message names the file and the problem.</summary>
public sealed class IngestException(string message, Exception? inner = null) : Exception(message, inner);
