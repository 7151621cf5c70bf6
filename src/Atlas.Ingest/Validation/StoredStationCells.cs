using Atlas.Storage.Cells;
using Atlas.Storage.Datasets;
using Atlas.Storage.Queries;
using Microsoft.Extensions.Options;

namespace Atlas.Ingest.Validation;

/// <summary>
/// Finds stations' cells straight from the stores (no in-memory catalogue: a validation run asks once per station),
/// with the same rule and words as a point request (<see cref="WetCellReach"/>).
/// </summary>
public sealed class StoredStationCells(DatasetStore datasets, DatasetGeometryQueries geometry, CellStore cells, IOptions<StationCellOptions> options)
    : IStationCellFinder
{
    public async Task<(NearestCell? Cell, string? NotCovered)> NearestWetAsync(DatasetRecord dataset, double latitude, double longitude, CancellationToken cancel)
    {
        var settings = options.Value;
        var spacing = settings.PointMaxDistanceKm is null ? await geometry.TypicalSpacingMetresAsync(dataset.Id, cancel) : null;
        var limitKm = WetCellReach.LimitKilometres(settings.PointMaxDistanceKm, settings.PointMaxDistanceGridSpacings, spacing);
        if (await geometry.GridExtentAsync(dataset.Id, cancel) is not { } extent) return (null, WetCellReach.NoWetCellsYet(dataset.Slug).Detail);
        if (WetCellReach.OutsideExtent(dataset.Slug, latitude, longitude, extent, limitKm) is { } outside) return (null, outside.Detail);
        var nearest = await cells.NearestWetAsync(dataset.Id, latitude, longitude, cancel);
        if (nearest is null) return (null, WetCellReach.NoWetCells(dataset.Slug).Detail);
        if (WetCellReach.TooFar(dataset.Slug, nearest, limitKm) is { } tooFar) return (null, tooFar.Detail);
        return (nearest, null);
    }

    public Task<SortedDictionary<int, long[]>> TimelinesAsync(DatasetRecord dataset, CancellationToken cancel) =>
        datasets.TimelinesAsync(dataset.Id, cancel);
}
