using Atlas.Storage.Registry;
using Npgsql;
using NpgsqlTypes;

namespace Atlas.Storage.Devices;

/// <summary>Device power matrices, by slug or name.</summary>
public sealed class DeviceStore(NpgsqlDataSource dataSource)
{
    private readonly NamedRecordTable<StoredDeviceMatrix> _table = new(dataSource, "device_matrix", "matrix_id",
        "matrix_id, slug, name, axis_kind, hs_centres_m, period_centres_s, power_kw, rated_power_kw, source_file, source_sha256, created_at",
        Read);

    /// <summary>Stores a matrix. Throws <see cref="DuplicateDeviceException"/> when the name or slug is taken.</summary>
    public async Task<StoredDeviceMatrix> AddAsync(DeviceMatrixDefinition device, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(device);
        if (device.PowerKw.GetLength(0) != device.HsCentresMetres.Length || device.PowerKw.GetLength(1) != device.PeriodCentresSeconds.Length)
            throw new ArgumentException(
                $"Device '{device.Name}': the power matrix is {device.PowerKw.GetLength(0)} x {device.PowerKw.GetLength(1)} but has " +
                $"{device.HsCentresMetres.Length} Hs and {device.PeriodCentresSeconds.Length} period bins.", nameof(device));
        await using var command = dataSource.CreateCommand("""
            INSERT INTO device_matrix (slug, name, axis_kind, hs_centres_m, period_centres_s, power_kw, rated_power_kw, source_file, source_sha256)
            VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9) RETURNING matrix_id
            """);
        command.Parameters.AddWithValue(device.Slug);
        command.Parameters.AddWithValue(device.Name);
        command.Parameters.AddWithValue(AxisName(device.AxisKind));
        command.Parameters.AddWithValue(device.HsCentresMetres);
        command.Parameters.AddWithValue(device.PeriodCentresSeconds);
        command.Parameters.Add(new NpgsqlParameter { Value = device.PowerKw, NpgsqlDbType = NpgsqlDbType.Array | NpgsqlDbType.Double });
        command.Parameters.AddWithValue(device.RatedPowerKw);
        command.Parameters.AddWithValue(device.SourceFile);
        command.Parameters.AddWithValue(device.SourceSha256);
        try
        {
            await command.ExecuteScalarAsync(cancel);
        }
        catch (PostgresException e) when (e.SqlState == PostgresErrorCodes.UniqueViolation)
        {
            throw new DuplicateDeviceException(
                $"A device named '{device.Name}' (or with the URL name '{device.Slug}') is already stored; choose another name or remove it first.");
        }
        return (await FindAsync(device.Slug, cancel))!;
    }

    /// <summary>
    /// Stores a matrix unless it is already there: a device of the same name read from the same file (SHA-256) with the
    /// same rated power is returned unchanged. Throws <see cref="DuplicateDeviceException"/> when the name is taken by
    /// another matrix, or the file is already stored under another name.
    /// </summary>
    public async Task<DeviceRegistration> RegisterAsync(DeviceMatrixDefinition device, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(device);
        if ((await FindAsync(device.Name, cancel) ?? await FindAsync(device.Slug, cancel)) is { } existing)
        {
            if (existing.SourceSha256 != device.SourceSha256 || Math.Abs(existing.RatedPowerKw - device.RatedPowerKw) > 1e-9 * device.RatedPowerKw)
                throw new DuplicateDeviceException(
                    $"Device '{existing.Name}' is already stored with another matrix ({existing.SourceFile}, sha256 {existing.SourceSha256[..12]}..., " +
                    $"rated {existing.RatedPowerKw:0.###} kW); remove it first to replace it.");
            return new DeviceRegistration(existing, AlreadyRegistered: true);
        }
        if ((await FindBySha256Async(device.SourceSha256, cancel)).FirstOrDefault() is { } sameFile)
            throw new DuplicateDeviceException(
                $"This matrix file ({device.SourceFile}, sha256 {device.SourceSha256[..12]}...) is already stored as device '{sameFile.Name}'.");
        return new DeviceRegistration(await AddAsync(device, cancel), AlreadyRegistered: false);
    }

    /// <summary>Every stored matrix, by name.</summary>
    public Task<IReadOnlyList<StoredDeviceMatrix>> ListAsync(CancellationToken cancel = default) => _table.ListAsync(cancel);

    /// <summary>The matrix with this slug or name (names compared case-insensitively), or null.</summary>
    public Task<StoredDeviceMatrix?> FindAsync(string nameOrSlug, CancellationToken cancel = default) => _table.FindAsync(nameOrSlug, cancel);

    /// <summary>The matrices read from a file with this SHA-256.</summary>
    public Task<IReadOnlyList<StoredDeviceMatrix>> FindBySha256Async(string sha256, CancellationToken cancel = default) =>
        _table.FindBySha256Async(sha256, cancel);

    /// <summary>Removes a matrix; false when there is no such device.</summary>
    public Task<bool> DeleteAsync(string nameOrSlug, CancellationToken cancel = default) => _table.DeleteAsync(nameOrSlug, d => d.Id, cancel);

    public static string AxisName(DeviceAxisKind kind) => kind == DeviceAxisKind.Te ? "te" : "tp";

    private static StoredDeviceMatrix Read(NpgsqlDataReader reader) => new(
        reader.GetInt32(0),
        new DeviceMatrixDefinition(reader.GetString(1), reader.GetString(2),
            reader.GetString(3) == "te" ? DeviceAxisKind.Te : DeviceAxisKind.Tp,
            reader.GetFieldValue<double[]>(4), reader.GetFieldValue<double[]>(5), reader.GetFieldValue<double[,]>(6),
            reader.GetDouble(7), reader.GetString(8), reader.GetString(9)),
        reader.GetDateTime(10).ToUniversalTime());
}
