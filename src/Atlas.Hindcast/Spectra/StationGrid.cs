namespace Atlas.Hindcast.Spectra;

/// <summary>
/// The output points of a spectral hindcast as a grid of points with no connection between them (CF discrete sampling
/// geometry, featureType timeSeries): point index = station index in the file.
/// </summary>
public sealed class StationGrid : HindcastGrid
{
    public StationGrid(IReadOnlyList<SpectralStation> stations)
        : base(stations.Select(s => s.Longitude).ToArray(), stations.Select(s => s.Latitude).ToArray())
    {
        Names = stations.Select(s => s.Name).ToArray();
    }

    public override GridKind Kind => GridKind.Stations;

    /// <summary>The name of each station, in point order.</summary>
    public IReadOnlyList<string> Names { get; }

    public override bool IsSameAs(HindcastGrid other, double toleranceDegrees = 1e-5) =>
        other is StationGrid s && s.Names.SequenceEqual(Names) && base.IsSameAs(other, toleranceDegrees);
}
