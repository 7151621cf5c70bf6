using System.Globalization;
using System.Security.Cryptography;
using Atlas.Assessment.Yield;
using Atlas.Storage.Devices;
using Atlas.Storage.Stations;
using Npgsql;

namespace Atlas.Ingest.Assessment;

/// <summary>The outcome of a device load.</summary>
public sealed record DeviceLoadResult(StoredDeviceMatrix Device, bool AlreadyRegistered)
{
    public string Describe()
    {
        var d = Device;
        return AlreadyRegistered
            ? $"device {d.Name}: already stored from {d.SourceFile} (unchanged)"
            : string.Create(CultureInfo.InvariantCulture,
                $"device {d.Name}: {d.HsCentresMetres.Length} Hs x {d.PeriodCentresSeconds.Length} {DeviceStore.AxisName(d.AxisKind)} bins " +
                $"(Hs {d.HsCentresMetres[0]:0.##}..{d.HsCentresMetres[^1]:0.##} m, {DeviceStore.AxisName(d.AxisKind)} {d.PeriodCentresSeconds[0]:0.##}..{d.PeriodCentresSeconds[^1]:0.##} s), " +
                $"rated {d.RatedPowerKw:0.###} kW, from {d.SourceFile}");
    }
}

/// <summary>
/// Reads a power-matrix CSV (layout of <see cref="PowerMatrixCsv"/>), checks it whole, and stores it under a name; a bad
/// matrix stores nothing, and loading the same file under the same name again changes nothing. The one registration
/// path: <c>atlas devices add</c> and <c>POST /api/v1/devices</c> both come here.
/// </summary>
public sealed class DeviceLoader(NpgsqlDataSource dataSource)
{
    /// <param name="ratedPowerKw">Rated power; null to take the largest matrix value.</param>
    /// <exception cref="ArgumentException">The name is unusable, or the rated power is below the largest matrix value.</exception>
    /// <exception cref="Atlas.Assessment.CsvInputException">The matrix is invalid; every problem with line and column.</exception>
    /// <exception cref="DuplicateDeviceException">The name or the file is stored differently.</exception>
    public async Task<DeviceLoadResult> LoadAsync(string name, string filePath, double? ratedPowerKw = null, CancellationToken cancel = default)
    {
        RequireName(name);
        if (!File.Exists(filePath)) throw new FileNotFoundException($"{filePath}: no such file", filePath);
        return await LoadAsync(name, await File.ReadAllBytesAsync(filePath, cancel), Path.GetFileName(filePath), ratedPowerKw, cancel);
    }

    /// <summary>As <see cref="LoadAsync(string, string, double?, CancellationToken)"/>, from the file's bytes (an upload).</summary>
    public async Task<DeviceLoadResult> LoadAsync(string name, byte[] bytes, string fileName, double? ratedPowerKw = null, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(bytes);
        var slug = RequireName(name);
        name = name.Trim();
        using var reader = new StreamReader(new MemoryStream(bytes), detectEncodingFromByteOrderMarks: true);
        var matrix = PowerMatrixCsv.Parse(reader, fileName, ratedPowerKw);
        var definition = DeviceMatrices.DefinitionOf(matrix, slug, name, fileName, Convert.ToHexStringLower(SHA256.HashData(bytes)));
        var registration = await new DeviceStore(dataSource).RegisterAsync(definition, cancel);
        return new DeviceLoadResult(registration.Device, registration.AlreadyRegistered);
    }

    private static string RequireName(string name) =>
        ReferenceSlug.From(name.Trim()) ?? throw new ArgumentException($"Device name '{name.Trim()}' needs at least one letter or digit.", nameof(name));
}
