namespace Atlas.Storage.Jobs;

public enum JobKind { Ingest, Statistics }

public sealed record JobRecord(
    long Id,
    JobKind Kind,
    string DatasetSlug,
    string State,
    string PayloadJson,
    int Attempts,
    string? ClaimedBy,
    DateTime CreatedAtUtc,
    DateTime? FinishedAtUtc,
    string? ProgressJson,
    string? Error,
    string? Summary);
