namespace Atlas.Storage.Jobs;

/// <summary>What a job does: a whole ingest, a whole statistics pass, or one part of a statistics pass or of an ingest in parts.</summary>
public enum JobKind { Ingest, Statistics, StatisticsPart, IngestPart }

/// <param name="PassId">The pass a part belongs to (<see cref="Passes.PassStore"/>); null for a whole job.</param>
/// <param name="Part">The part's number within its pass, from 0; null for a whole job.</param>
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
    string? Summary,
    long? PassId = null,
    int? Part = null);
