namespace Atlas.Storage.Passes;

/// <summary>What a pass in parts does: a statistics pass by blocks of cells, or the first load of a dataset by ranges of cells.</summary>
public enum PassKind { Statistics, Ingest }

/// <summary>A pass run in parts (table <c>pass</c>).</summary>
/// <param name="DatasetId">The dataset's id; for an ingest pass, the id reserved for the dataset it creates.</param>
/// <param name="State">open (parts queued or running), done (stored as a whole) or failed (nothing of it stored).</param>
/// <param name="Blocks">The blocks of 1,024 cell ids a statistics pass recomputes, ascending; empty for an ingest pass.</param>
/// <param name="ComputedAtUtc">The time its cells are stamped computed at: its start, as for a plain pass.</param>
public sealed record PassRecord(
    long Id,
    int DatasetId,
    string DatasetSlug,
    PassKind Kind,
    string State,
    string PayloadJson,
    int PartCount,
    int[] Blocks,
    DateTime ComputedAtUtc,
    DateTime CreatedAtUtc,
    DateTime? FinishedAtUtc,
    string? Error);

/// <summary>A pass with how many of its parts are in each state.</summary>
/// <param name="FirstClaimUtc">When its first part was claimed, or null before any.</param>
/// <param name="LastDoneUtc">When its latest part was done, or null before any.</param>
public sealed record PassProgress(PassRecord Pass, int Done, int Running, int Queued, int Failed, DateTime? FirstClaimUtc,
    DateTime? LastDoneUtc)
{
    /// <summary>
    /// The time left, estimated from the parts done so far at their mean rate since the first claim; null before a
    /// part is done or once the pass has ended.
    /// </summary>
    public TimeSpan? Remaining(DateTime nowUtc)
    {
        if (Pass.State != "open" || Done == 0 || FirstClaimUtc is not { } first) return null;
        var perPart = (nowUtc - first) / Done;
        return perPart * (Pass.PartCount - Done);
    }
}

/// <summary>What became of a part when its worker tried to mark it done.</summary>
public enum PartOutcome
{
    /// <summary>Marked done; other parts of the pass are not done yet.</summary>
    Stored,

    /// <summary>Marked done as the last part: the whole pass is stored and visible.</summary>
    PassCompleted,

    /// <summary>The worker no longer held the part (its lease lapsed and the part went back to the queue); nothing changed.</summary>
    Lost,

    /// <summary>The pass has ended (failed, or its dataset was removed); nothing changed.</summary>
    PassGone,
}

/// <summary>Another pass of the dataset is open: two passes of one dataset never interleave.</summary>
public sealed class PassOpenException(string datasetSlug, long? openPassId, PassKind? openKind = null)
    : InvalidOperationException($"dataset '{datasetSlug}' already has {(openKind == PassKind.Ingest ? "an ingest" : "a statistics pass")} in parts under way" +
        (openPassId is { } id ? $" (pass {id})" : "") + "; wait for it to finish (atlas jobs shows its parts) and try again.")
{
    public long? OpenPassId { get; } = openPassId;
}
