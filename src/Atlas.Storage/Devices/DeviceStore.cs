using Npgsql;
using NpgsqlTypes;

namespace Atlas.Storage.Devices;

/// <summary>Device power matrices, by slug or name.</summary>
public sealed class DeviceStore(NpgsqlDataSource dataSource)
{
    private const string Columns =
        "matrix_id, slug, name, axis_kind, hs_centres_m, period_centres_s, power_kw, rated_power_kw, source_file, source_sha256, created_at";

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

    public async Task<IReadOnlyList<StoredDeviceMatrix>> ListAsync(CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand($"SELECT {Columns} FROM device_matrix ORDER BY name");
        return await ReadAllAsync(command, cancel);
    }

    /// <summary>The matrix with this slug or name (names compared case-insensitively), or null.</summary>
    public async Task<StoredDeviceMatrix?> FindAsync(string nameOrSlug, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand(
            $"SELECT {Columns} FROM device_matrix WHERE slug = $1 OR lower(name) = lower($1) ORDER BY slug = $1 DESC LIMIT 1");
        command.Parameters.AddWithValue(nameOrSlug);
        var rows = await ReadAllAsync(command, cancel);
        return rows.Count == 0 ? null : rows[0];
    }

    /// <summary>The matrices read from a file with this SHA-256.</summary>
    public async Task<IReadOnlyList<StoredDeviceMatrix>> FindBySha256Async(string sha256, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand($"SELECT {Columns} FROM device_matrix WHERE source_sha256 = $1 ORDER BY name");
        command.Parameters.AddWithValue(sha256.ToLowerInvariant());
        return await ReadAllAsync(command, cancel);
    }

    /// <summary>Removes a matrix; false when there is no such device.</summary>
    public async Task<bool> DeleteAsync(string nameOrSlug, CancellationToken cancel = default)
    {
        if (await FindAsync(nameOrSlug, cancel) is not { } device) return false;
        await using var command = dataSource.CreateCommand("DELETE FROM device_matrix WHERE matrix_id = $1");
        command.Parameters.AddWithValue(device.Id);
        return await command.ExecuteNonQueryAsync(cancel) > 0;
    }

    public static string AxisName(DeviceAxisKind kind) => kind == DeviceAxisKind.Te ? "te" : "tp";

    private static async Task<IReadOnlyList<StoredDeviceMatrix>> ReadAllAsync(NpgsqlCommand command, CancellationToken cancel)
    {
        var rows = new List<StoredDeviceMatrix>();
        await using var reader = await command.ExecuteReaderAsync(cancel);
        while (await reader.ReadAsync(cancel))
            rows.Add(new StoredDeviceMatrix(
                reader.GetInt32(0), reader.GetString(1), reader.GetString(2),
                reader.GetString(3) == "te" ? DeviceAxisKind.Te : DeviceAxisKind.Tp,
                reader.GetFieldValue<double[]>(4), reader.GetFieldValue<double[]>(5), reader.GetFieldValue<double[,]>(6),
                reader.GetDouble(7), reader.GetString(8), reader.GetString(9), reader.GetDateTime(10).ToUniversalTime()));
        return rows;
    }
}
