namespace Atlas.Storage.Devices;

/// <summary>The wave period a power matrix's columns are expressed in.</summary>
public enum DeviceAxisKind
{
    /// <summary>Energy period Te (stored as <c>te</c>).</summary>
    Te,
    /// <summary>Peak period Tp (stored as <c>tp</c>).</summary>
    Tp,
}

/// <summary>A device power matrix to store: power in kW at bin centres, [Hs bin, period bin].</summary>
/// <param name="Slug">URL name (see <see cref="Stations.ReferenceSlug"/>).</param>
/// <param name="SourceFile">File name without its folder.</param>
/// <param name="SourceSha256">SHA-256 of the file, 64 lower-case hex digits.</param>
public sealed record DeviceMatrixDefinition(
    string Slug,
    string Name,
    DeviceAxisKind AxisKind,
    double[] HsCentresMetres,
    double[] PeriodCentresSeconds,
    double[,] PowerKw,
    double RatedPowerKw,
    string SourceFile,
    string SourceSha256);

/// <summary>A stored power matrix.</summary>
public sealed record StoredDeviceMatrix(
    int Id,
    string Slug,
    string Name,
    DeviceAxisKind AxisKind,
    double[] HsCentresMetres,
    double[] PeriodCentresSeconds,
    double[,] PowerKw,
    double RatedPowerKw,
    string SourceFile,
    string SourceSha256,
    DateTime CreatedAtUtc);

/// <summary>The outcome of <see cref="DeviceStore.RegisterAsync"/>: the stored matrix, and whether it was there already.</summary>
public sealed record DeviceRegistration(StoredDeviceMatrix Device, bool AlreadyRegistered);

/// <summary>Thrown when a device's name (or slug) is already stored.</summary>
public sealed class DuplicateDeviceException(string message) : Exception(message);
