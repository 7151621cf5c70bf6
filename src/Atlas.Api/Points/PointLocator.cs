using Atlas.Api.Infrastructure;
using Atlas.Storage.Cells;
using Atlas.Storage.Datasets;
using Microsoft.AspNetCore.Http.HttpResults;
using Microsoft.Extensions.Options;

namespace Atlas.Api.Points;

/// <summary>A position resolved to its dataset and nearest wet cell.</summary>
public sealed record LocatedPoint(DatasetRecord Dataset, NearestCell Nearest, double LimitKilometres);

/// <summary>
/// Turns lat and lon query values into the nearest wet cell of a dataset, or into the problem that says what to
/// fix: a missing or non-numeric coordinate, one off the globe, a position outside the dataset's extent, or one
/// farther from every wet cell than the distance limit (a fixed km, or a multiple of the typical cell spacing).
/// </summary>
public sealed class PointLocator(DatasetCatalog catalog, CellStore cells, IOptions<AtlasApiOptions> options)
{
    /// <summary>Parses lat and lon into <paramref name="errors"/>; returns null when either is unusable.</summary>
    public static (double Latitude, double Longitude)? ParsePosition(string? lat, string? lon, Dictionary<string, string[]> errors)
    {
        var latitude = Coordinate("lat", lat, 90, "latitude in degrees north, -90..90", errors);
        var longitude = Coordinate("lon", lon, 180, "longitude in degrees east, -180..180", errors);
        return latitude is { } y && longitude is { } x ? (y, x) : null;
    }

    public async Task<(LocatedPoint? Point, ProblemHttpResult? Problem)> LocateAsync(string slug, double latitude, double longitude, CancellationToken cancel)
    {
        var dataset = await catalog.FindAsync(slug, cancel);
        if (dataset is null) return (null, ApiProblems.UnknownDataset(slug));
        var limitKm = await LimitKilometresAsync(dataset, cancel);
        if (await catalog.ExtentAsync(dataset, cancel) is not { } extent) return (null, Problem(WetCellReach.NoWetCellsYet(slug)));
        // Allow positions just outside the envelope of the grid's cell centres, as far as the distance limit reaches.
        if (WetCellReach.OutsideExtent(slug, latitude, longitude, extent, limitKm) is { } outside) return (null, Problem(outside));
        var nearest = await catalog.WetCellsAsync(dataset, cancel) is { } index
            ? index.Nearest(latitude, longitude)
            : await cells.NearestWetAsync(dataset.Id, latitude, longitude, cancel);
        if (nearest is null) return (null, Problem(WetCellReach.NoWetCells(slug)));
        if (WetCellReach.TooFar(slug, nearest, limitKm) is { } tooFar) return (null, Problem(tooFar));
        return (new LocatedPoint(dataset, nearest, limitKm), null);
    }

    private async Task<double> LimitKilometresAsync(DatasetRecord dataset, CancellationToken cancel)
    {
        var settings = options.Value;
        var spacing = settings.PointMaxDistanceKm is null ? await catalog.TypicalSpacingMetresAsync(dataset, cancel) : null;
        return WetCellReach.LimitKilometres(settings.PointMaxDistanceKm, settings.PointMaxDistanceGridSpacings, spacing);
    }

    private static ProblemHttpResult Problem(ReachRefusal refusal) => ApiProblems.Unprocessable(refusal.Title, refusal.Detail);

    private static double? Coordinate(string name, string? text, double bound, string meaning, Dictionary<string, string[]> errors) =>
        QueryNumbers.Read(name, text, "the " + meaning, errors, required: true, -bound, bound);
}
