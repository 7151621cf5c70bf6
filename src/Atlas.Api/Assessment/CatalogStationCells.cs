namespace Atlas.Api.Assessment;

/// <summary>Stations' cells as the API finds them: through the point locator and the dataset catalogue, so a station is covered exactly when a point request there is answered.</summary>
public sealed class CatalogStationCells(PointLocator locator, DatasetCatalog catalog) : IStationCellFinder
{
    public async Task<(NearestCell? Cell, string? NotCovered)> NearestWetAsync(DatasetRecord dataset, double latitude, double longitude, CancellationToken cancel)
    {
        var (point, problem) = await locator.LocateAsync(dataset.Slug, latitude, longitude, cancel);
        return point is null
            ? (null, problem!.ProblemDetails.Detail ?? problem.ProblemDetails.Title ?? "the station lies outside the dataset")
            : (point.Nearest, null);
    }

    public Task<SortedDictionary<int, long[]>> TimelinesAsync(DatasetRecord dataset, CancellationToken cancel) => catalog.TimelinesAsync(dataset, cancel);
}
