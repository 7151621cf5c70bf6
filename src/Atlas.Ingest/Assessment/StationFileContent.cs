using Atlas.Storage.Stations;

namespace Atlas.Ingest.Assessment;

/// <summary>A station record read from a file and checked, ready to store.</summary>
/// <param name="SourceFile">The file name without its folder.</param>
/// <param name="Format"><c>csv</c> or <c>netcdf</c>.</param>
/// <param name="Sha256">SHA-256 of the file's bytes, lower-case hex.</param>
/// <param name="Observations">Rows in time order; NaN where a value was not measured.</param>
/// <param name="Latitude">The station latitude the file states (NetCDF), or null.</param>
/// <param name="Longitude">The station longitude the file states (NetCDF), or null.</param>
/// <param name="MissingHsCount">Rows without Hs (flagged CSV rows, NetCDF fill values); kept and counted as missing when matched.</param>
public sealed record StationFileContent(
    string SourceFile,
    string Format,
    string Sha256,
    IReadOnlyList<StationObservationRow> Observations,
    bool HasTp,
    bool HasTe,
    bool HasDirection,
    double? Latitude,
    double? Longitude,
    int MissingHsCount)
{
    public int FlaggedCount => Observations.Count(o => o.Qc != 0);
}
