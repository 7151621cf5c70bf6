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
public record DeviceMatrixDefinition(
    string Slug,
    string Name,
    DeviceAxisKind AxisKind,
    double[] HsCentresMetres,
    double[] PeriodCentresSeconds,
    double[,] PowerKw,
    double RatedPowerKw,
    string SourceFile,
    string SourceSha256);

/// <summary>A stored power matrix: its definition as stored (whose members it has), with its id and when it was stored.</summary>
/// <param name="Definition">The matrix as it was stored.</param>
/// <param name="CreatedAtUtc">When it was stored.</param>
public sealed record StoredDeviceMatrix(int Id, DeviceMatrixDefinition Definition, DateTime CreatedAtUtc) : DeviceMatrixDefinition(Definition);

/// <summary>The outcome of <see cref="DeviceStore.RegisterAsync"/>: the stored matrix, and whether it was there already.</summary>
public sealed record DeviceRegistration(StoredDeviceMatrix Device, bool AlreadyRegistered);

/// <summary>Thrown when a device's name (or slug) is already stored.</summary>
public sealed class DuplicateDeviceException(string message) : Exception(message);
