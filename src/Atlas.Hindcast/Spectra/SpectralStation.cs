namespace Atlas.Hindcast.Spectra;

/// <summary>One output point of a spectral file.</summary>
/// <param name="Name">Its name from the file's timeseries_id variable, or "station N" (1-based) when the file has none.</param>
/// <param name="Latitude">Degrees north.</param>
/// <param name="Longitude">Degrees east in [-180, 180).</param>
/// <param name="DepthMetres">Water depth, m, positive down; NaN when neither the file nor the mapping gives one.</param>
public sealed record SpectralStation(string Name, double Latitude, double Longitude, double DepthMetres);
