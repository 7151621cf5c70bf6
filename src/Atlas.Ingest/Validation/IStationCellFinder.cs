using Atlas.Storage.Cells;
using Atlas.Storage.Datasets;

namespace Atlas.Ingest.Validation;

/// <summary>
/// Where validation finds a station's cell and a dataset's time lines. The API answers from its in-memory catalogue
/// (exactly what a point request at the station would get); the command line from the stores
/// (<see cref="StoredStationCells"/>). Both apply <see cref="WetCellReach"/> with the configured distance limit.
/// </summary>
public interface IStationCellFinder
{
    /// <summary>The nearest wet cell, or why the dataset does not cover the position.</summary>
    Task<(NearestCell? Cell, string? NotCovered)> NearestWetAsync(DatasetRecord dataset, double latitude, double longitude, CancellationToken cancel);

    /// <summary>The time line (Unix seconds) of every stored year, by year.</summary>
    Task<SortedDictionary<int, long[]>> TimelinesAsync(DatasetRecord dataset, CancellationToken cancel);
}
