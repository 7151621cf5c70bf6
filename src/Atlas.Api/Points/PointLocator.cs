namespace Atlas.Api.Points;

/// <summary>A position resolved to its dataset and nearest wet cell.</summary>
public sealed record LocatedPoint(DatasetRecord Dataset, NearestCell Nearest, double LimitKilometres)
{
    /// <summary>The position asked for (degrees north and east).</summary>
    public (double Latitude, double Longitude) Asked { get; init; }

    /// <summary>The cell as point answers describe it.</summary>
    public PointCell Cell
    {
        get
        {
            var c = Nearest.Cell;
            // Depth and coast distance are stored as floats: written at their own precision, not their double expansion.
            return new PointCell(c.CellId, c.Latitude, c.Longitude, c.DepthMetres is { } d ? DataPrecisionJsonConverter.Round(d) : null,
                Math.Round(Nearest.DistanceMetres, 1), c.CoastDistanceMetres is { } k ? Math.Round(k, 1) : null);
        }
    }
}

/// <summary>
/// Turns a position into the nearest wet cell of a dataset, or into the problem that says what to fix: a position
/// outside the dataset's extent, or one farther from every wet cell than the distance limit (a fixed km, or a multiple of the typical cell spacing).
/// </summary>
public sealed class PointLocator(DatasetCatalog catalog, CellStore cells, IOptions<AtlasApiOptions> options)
{
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
        return (new LocatedPoint(dataset, nearest, limitKm) { Asked = (latitude, longitude) }, null);
    }

    private async Task<double> LimitKilometresAsync(DatasetRecord dataset, CancellationToken cancel)
    {
        var settings = options.Value;
        var spacing = settings.PointMaxDistanceKm is null ? await catalog.TypicalSpacingMetresAsync(dataset, cancel) : null;
        return WetCellReach.LimitKilometres(settings.PointMaxDistanceKm, settings.PointMaxDistanceGridSpacings, spacing);
    }

    private static ProblemHttpResult Problem(ReachRefusal refusal) => ApiProblems.Unprocessable(refusal.Title, refusal.Detail);

}
