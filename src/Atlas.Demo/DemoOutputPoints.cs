namespace Atlas.Demo;

/// <summary>An output point where the demo hindcast writes full spectra.</summary>
/// <param name="Name">Its invented name.</param>
/// <param name="WetCell">The grid cell it stands in (its sea state is that cell's).</param>
public sealed record DemoOutputPoint(string Name, int WetCell, double Latitude, double Longitude, double DepthMetres);

/// <summary>
/// The demo's spectral output points, as a hindcast team would choose them: at the two buoy moorings (to compare spectra
/// with the buoys) and at the inshore edge of an invented lease area on the shelf, where the depth makes the spectral power
/// differ from the parametric one.
/// </summary>
public static class DemoOutputPoints
{
    private static readonly (string Name, double XKm, double YKm)[] Places =
    [
        ("Gannetby Deep", 140.0, 42.0),
        ("Quellmouth Approach", 146.0, 86.0),
        ("Tollan Lease Inshore Edge", 158.0, 64.0),
    ];

    /// <summary>The output points placed on <paramref name="grid"/>.</summary>
    public static IReadOnlyList<DemoOutputPoint> Place(DemoGrid grid)
    {
        ArgumentNullException.ThrowIfNull(grid);
        return Places.Select(p =>
        {
            int cell = grid.NearestWetCellKm(p.XKm, p.YKm);
            return new DemoOutputPoint(p.Name, cell, grid.LatitudeOf(cell), grid.LongitudeOf(cell), grid.DepthMetres[cell]);
        }).ToArray();
    }
}
