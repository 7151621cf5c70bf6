namespace Atlas.Storage.Stations;

/// <summary>What a station record is used for: calibrating the hindcast, or kept aside for independent validation.</summary>
public enum StationRole
{
    Calibration,
    Validation,
}

/// <summary>A station to register, with the file its record came from.</summary>
/// <param name="Slug">URL name (see <see cref="ReferenceSlug"/>).</param>
/// <param name="DepthMetres">Water depth at the mooring, m; null when unknown.</param>
/// <param name="SourceFile">File name without its folder.</param>
/// <param name="SourceSha256">SHA-256 of the file, 64 lower-case hex digits.</param>
/// <param name="SourceFormat"><c>csv</c> or <c>netcdf</c>.</param>
/// <param name="HasTp">The record carries Tp.</param>
/// <param name="HasTe">The record carries Te.</param>
/// <param name="HasDirection">The record carries the mean direction.</param>
public record StationDefinition(
    string Slug,
    string Name,
    double Latitude,
    double Longitude,
    double? DepthMetres,
    string Instrument,
    StationRole Role,
    string SourceFile,
    string SourceSha256,
    string SourceFormat,
    bool HasTp,
    bool HasTe,
    bool HasDirection);

/// <summary>A registered station: its definition as registered (whose members it has), with its id and a summary of its stored record.</summary>
/// <param name="Definition">The station as it was registered.</param>
/// <param name="ObservationCount">Observations stored.</param>
/// <param name="FlaggedCount">Observations with a quality flag other than 0.</param>
/// <param name="TimeStartUtc">Time of the first observation.</param>
/// <param name="TimeEndUtc">Time of the last observation.</param>
/// <param name="LoadedAtUtc">When the record was stored.</param>
public sealed record StoredStation(
    int Id,
    StationDefinition Definition,
    int ObservationCount,
    int FlaggedCount,
    DateTime TimeStartUtc,
    DateTime TimeEndUtc,
    DateTime LoadedAtUtc) : StationDefinition(Definition);

/// <summary>One stored observation: NaN where the station did not measure a value; <paramref name="Qc"/> 0 is a good row.</summary>
public readonly record struct StationObservationRow(long TimeUnixSeconds, float Hs, float Tp, float Te, float Dir, short Qc);

/// <summary>A station's whole record as columns, in time order (NaN where not measured).</summary>
public sealed record StationObservationColumns(long[] TimesUnixSeconds, float[] Hs, float[] Tp, float[] Te, float[] Dir, short[] Qc)
{
    public int Count => TimesUnixSeconds.Length;
}

/// <summary>The outcome of <see cref="StationStore.RegisterAsync"/>: the stored station, and whether it was there already.</summary>
public sealed record StationRegistration(StoredStation Station, bool AlreadyRegistered);

/// <summary>Thrown when a station's name (or slug) is already registered.</summary>
public sealed class DuplicateStationException(string message) : Exception(message);
