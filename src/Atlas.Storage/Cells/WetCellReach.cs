using System.Globalization;

namespace Atlas.Storage.Cells;

/// <summary>Why a position is not answered by a dataset's cells: a short title and a detail that says what to fix.</summary>
public sealed record ReachRefusal(string Title, string Detail);

/// <summary>
/// How far from a dataset's wet cells a position may lie and still be answered by the nearest one: the rule that a
/// point request and a station validation share, with the words of each refusal.
/// </summary>
public static class WetCellReach
{
    /// <summary>The distance limit, km: <paramref name="fixedKm"/> when set, else <paramref name="gridSpacings"/> times the
    /// typical cell spacing (10 km when the dataset has too few wet cells to tell).</summary>
    public static double LimitKilometres(double? fixedKm, double gridSpacings, double? typicalSpacingMetres) =>
        fixedKm ?? gridSpacings * (typicalSpacingMetres ?? 10_000) / 1000;

    /// <summary>The refusal for a dataset with no wet cell loaded yet.</summary>
    public static ReachRefusal NoWetCellsYet(string slug) =>
        new("The dataset has no wet cells", $"Dataset '{slug}' has no wet cell loaded yet; ingest its files first.");

    /// <summary>The refusal for a dataset whose nearest-cell search found nothing.</summary>
    public static ReachRefusal NoWetCells(string slug) => new("The dataset has no wet cells", $"Dataset '{slug}' has no wet cell.");

    /// <summary>
    /// Null when the position lies within the envelope of the grid's cell centres widened by the distance limit;
    /// otherwise the refusal.
    /// </summary>
    public static ReachRefusal? OutsideExtent(string slug, double latitude, double longitude,
        (double West, double South, double East, double North) extent, double limitKm)
    {
        var marginLat = limitKm / 111.32;  // common practice: 111.32 km per degree of latitude
        var marginLon = marginLat / Math.Max(0.05, Math.Cos(latitude * Math.PI / 180));
        if (latitude >= extent.South - marginLat && latitude <= extent.North + marginLat
            && longitude >= extent.West - marginLon && longitude <= extent.East + marginLon)
            return null;
        return new ReachRefusal("Outside the dataset extent",
            $"({F(latitude)}, {F(longitude)}) lies outside dataset '{slug}', whose grid covers longitudes {F(extent.West)}..{F(extent.East)} " +
            $"and latitudes {F(extent.South)}..{F(extent.North)}. Choose a position inside it.");
    }

    /// <summary>Null when the nearest wet cell is within the limit; otherwise the refusal.</summary>
    public static ReachRefusal? TooFar(string slug, NearestCell nearest, double limitKm)
    {
        ArgumentNullException.ThrowIfNull(nearest);
        if (nearest.DistanceMetres <= limitKm * 1000) return null;
        return new ReachRefusal("No wet cell near this position",
            $"The nearest wet cell of '{slug}' (cell {nearest.Cell.CellId} at {F(nearest.Cell.Latitude)}, {F(nearest.Cell.Longitude)}) is " +
            $"{nearest.DistanceMetres / 1000:0.###} km away; the limit is {limitKm:0.###} km. The position is probably on land or beyond the " +
            "model's wet area: move it over the sea.");
    }

    private static string F(double v) => v.ToString("0.#####", CultureInfo.InvariantCulture);
}
