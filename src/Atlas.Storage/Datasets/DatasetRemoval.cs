namespace Atlas.Storage.Datasets;

/// <summary>What became of a request to remove a dataset.</summary>
public enum DatasetRemovalOutcome
{
    /// <summary>The dataset and every row keyed by it are gone.</summary>
    Removed,

    /// <summary>No dataset has that slug; nothing was changed.</summary>
    Unknown,

    /// <summary>An ingest or statistics pass of the dataset is running; nothing was changed.</summary>
    Busy,
}

/// <summary>The outcome of <see cref="DatasetStore.DeleteAsync"/>, with the reason when the dataset was busy.</summary>
/// <param name="RunningJobIds">The dataset's running jobs when it was busy (empty when an ingest outside the queue held its lock).</param>
public sealed record DatasetRemoval(DatasetRemovalOutcome Outcome, IReadOnlyList<long> RunningJobIds)
{
    public static readonly DatasetRemoval Removed = new(DatasetRemovalOutcome.Removed, []);
    public static readonly DatasetRemoval Unknown = new(DatasetRemovalOutcome.Unknown, []);

    /// <summary>Why the dataset could not be removed now, in a sentence; null unless <see cref="DatasetRemovalOutcome.Busy"/>.</summary>
    public string? BusyReason => Outcome != DatasetRemovalOutcome.Busy ? null
        : RunningJobIds.Count == 0 ? "an ingest of it is in progress"
        : RunningJobIds.Count == 1 ? $"job {RunningJobIds[0]} of it is running"
        : $"jobs {string.Join(", ", RunningJobIds)} of it are running";
}
