namespace Atlas.Api.Model;

/// <summary>The answer to a queued job: its id and where to poll its state.</summary>
public sealed record JobAccepted(long JobId, string Kind, string Dataset, string State, string Status);

/// <summary>The state of a queued job, as the job queue records it.</summary>
public sealed record JobStatus(long JobId, string Kind, string Dataset, string State, int Attempts, DateTime CreatedAtUtc,
    DateTime? FinishedAtUtc, string? Progress, string? Error, string? Summary);
