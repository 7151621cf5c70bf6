namespace Atlas.Ingest.Worker;

/// <summary>A part was taken from its worker (its lease lapsed and it went back to the queue); the worker drops it.</summary>
public sealed class PartLostException(long jobId, string? worker)
    : Exception($"job {jobId}: the part is no longer held by {worker ?? "this worker"} (its heartbeat lapsed and it was queued again); nothing of it was kept here");
