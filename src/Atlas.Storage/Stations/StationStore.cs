using Atlas.Storage.Copy;
using Atlas.Storage.Registry;
using Npgsql;
using NpgsqlTypes;

namespace Atlas.Storage.Stations;

/// <summary>Measuring stations and their records. A station and its observations are written in one transaction.</summary>
public sealed class StationStore(NpgsqlDataSource dataSource)
{
    private readonly NamedRecordTable<StoredStation> _table = new(dataSource, "station", "station_id", """
        station_id, slug, name, ST_Y(geom), ST_X(geom), depth_m, instrument, role, source_file, source_sha256, source_format,
        observation_count, flagged_count, has_tp, has_te, has_dir, time_start, time_end, loaded_at
        """, Read);

    /// <summary>
    /// Registers a station and bulk-loads its observations (binary COPY) in one transaction: either both are stored or
    /// neither. Throws <see cref="DuplicateStationException"/> when the name or slug is taken, and
    /// <see cref="ArgumentException"/> for an empty record or times that do not strictly increase.
    /// </summary>
    public async Task<StoredStation> AddAsync(StationDefinition station, IReadOnlyList<StationObservationRow> observations, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(station);
        ArgumentNullException.ThrowIfNull(observations);
        if (observations.Count == 0) throw new ArgumentException($"Station '{station.Name}' has no observations to store.", nameof(observations));
        for (var i = 1; i < observations.Count; i++)
            if (observations[i].TimeUnixSeconds <= observations[i - 1].TimeUnixSeconds)
                throw new ArgumentException($"Station '{station.Name}': observation {i} is not later than observation {i - 1}; times must strictly increase.", nameof(observations));

        await using var connection = await dataSource.OpenConnectionAsync(cancel);
        await using var transaction = await connection.BeginTransactionAsync(cancel);
        int id;
        await using (var insert = new NpgsqlCommand("""
            INSERT INTO station (slug, name, geom, depth_m, instrument, role, source_file, source_sha256, source_format,
                                 observation_count, flagged_count, has_tp, has_te, has_dir, time_start, time_end)
            VALUES ($1, $2, ST_SetSRID(ST_MakePoint($4, $3), 4326), $5, $6, $7, $8, $9, $10, $11, $12, $13, $14, $15, to_timestamp($16), to_timestamp($17))
            RETURNING station_id
            """, connection, transaction))
        {
            insert.Parameters.AddWithValue(station.Slug);
            insert.Parameters.AddWithValue(station.Name);
            insert.Parameters.AddWithValue(station.Latitude);
            insert.Parameters.AddWithValue(station.Longitude);
            insert.Parameters.AddWithValue(NpgsqlDbType.Real, station.DepthMetres is { } depth ? (float)depth : DBNull.Value);
            insert.Parameters.AddWithValue(station.Instrument);
            insert.Parameters.AddWithValue(RoleName(station.Role));
            insert.Parameters.AddWithValue(station.SourceFile);
            insert.Parameters.AddWithValue(station.SourceSha256);
            insert.Parameters.AddWithValue(station.SourceFormat);
            insert.Parameters.AddWithValue(observations.Count);
            insert.Parameters.AddWithValue(observations.Count(o => o.Qc != 0));
            insert.Parameters.AddWithValue(station.HasTp);
            insert.Parameters.AddWithValue(station.HasTe);
            insert.Parameters.AddWithValue(station.HasDirection);
            insert.Parameters.AddWithValue((double)observations[0].TimeUnixSeconds);
            insert.Parameters.AddWithValue((double)observations[^1].TimeUnixSeconds);
            try
            {
                id = (int)(await insert.ExecuteScalarAsync(cancel))!;
            }
            catch (PostgresException e) when (e.SqlState == PostgresErrorCodes.UniqueViolation)
            {
                throw new DuplicateStationException(
                    $"A station named '{station.Name}' (or with the URL name '{station.Slug}') is already registered; choose another name or remove it first.");
            }
        }

        await BinaryImport.WriteRowsAsync(connection,
            "COPY station_observation (station_id, time, hs, tp, te, dir, qc) FROM STDIN (FORMAT BINARY)", observations,
            async (writer, row, cancel) =>
            {
                await writer.WriteAsync(id, NpgsqlDbType.Integer, cancel);
                await writer.WriteAsync(DateTime.UnixEpoch.AddSeconds(row.TimeUnixSeconds), NpgsqlDbType.TimestampTz, cancel);
                await WriteValueAsync(writer, row.Hs, cancel);
                await WriteValueAsync(writer, row.Tp, cancel);
                await WriteValueAsync(writer, row.Te, cancel);
                await WriteValueAsync(writer, row.Dir, cancel);
                await writer.WriteAsync(row.Qc, NpgsqlDbType.Smallint, cancel);
            }, cancel);
        await transaction.CommitAsync(cancel);
        return (await FindAsync(station.Slug, cancel))!;
    }

    /// <summary>
    /// Registers a station unless it is already there: a station of the same name with the same record (SHA-256) and the
    /// same details is returned unchanged, so loading the same file again duplicates nothing. Throws
    /// <see cref="DuplicateStationException"/> when the name is taken by another record or other details, or when the
    /// record is already registered under another name.
    /// </summary>
    public async Task<StationRegistration> RegisterAsync(StationDefinition station, IReadOnlyList<StationObservationRow> observations, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(station);
        if ((await FindAsync(station.Name, cancel) ?? await FindAsync(station.Slug, cancel)) is { } existing)
        {
            if (existing.SourceSha256 != station.SourceSha256)
                throw new DuplicateStationException(
                    $"Station '{existing.Name}' is already registered with another record ({existing.SourceFile}, sha256 {existing.SourceSha256[..12]}...); " +
                    "remove it first to replace its record.");
            var differences = DifferencesOf(existing, station);
            if (differences.Count > 0)
                throw new DuplicateStationException(
                    $"Station '{existing.Name}' is already registered from this record but with other details ({string.Join("; ", differences)}); remove it first to change them.");
            return new StationRegistration(existing, AlreadyRegistered: true);
        }
        if ((await FindBySha256Async(station.SourceSha256, cancel)).FirstOrDefault() is { } sameRecord)
            throw new DuplicateStationException(
                $"This record ({station.SourceFile}, sha256 {station.SourceSha256[..12]}...) is already registered as station '{sameRecord.Name}'.");
        return new StationRegistration(await AddAsync(station, observations, cancel), AlreadyRegistered: false);
    }

    private static List<string> DifferencesOf(StoredStation stored, StationDefinition asked)
    {
        var differences = new List<string>();
        // Positions are stored as double; a micro-degree (about 0.1 m) absorbs text round trips of the coordinates.
        if (Math.Abs(stored.Latitude - asked.Latitude) > 1e-6 || Math.Abs(stored.Longitude - asked.Longitude) > 1e-6)
            differences.Add($"position {stored.Latitude:0.######}, {stored.Longitude:0.######} stored, {asked.Latitude:0.######}, {asked.Longitude:0.######} given");
        // Depth is stored as real (float4), so compare at float precision.
        if ((stored.DepthMetres is null) != (asked.DepthMetres is null)
            || (stored.DepthMetres is { } sd && asked.DepthMetres is { } ad && Math.Abs(sd - (float)ad) > 1e-3))
            differences.Add($"depth {Show(stored.DepthMetres)} m stored, {Show(asked.DepthMetres)} m given");
        if (stored.Instrument != asked.Instrument) differences.Add($"instrument '{stored.Instrument}' stored, '{asked.Instrument}' given");
        if (stored.Role != asked.Role) differences.Add($"role {RoleName(stored.Role)} stored, {RoleName(asked.Role)} given");
        return differences;

        static string Show(double? depth) => depth is { } v ? v.ToString("0.###", System.Globalization.CultureInfo.InvariantCulture) : "unknown";
    }

    /// <summary>Every registered station, by name.</summary>
    public Task<IReadOnlyList<StoredStation>> ListAsync(CancellationToken cancel = default) => _table.ListAsync(cancel);

    /// <summary>The station with this slug or name (names compared case-insensitively), or null.</summary>
    public Task<StoredStation?> FindAsync(string nameOrSlug, CancellationToken cancel = default) => _table.FindAsync(nameOrSlug, cancel);

    /// <summary>The stations whose record came from a file with this SHA-256.</summary>
    public Task<IReadOnlyList<StoredStation>> FindBySha256Async(string sha256, CancellationToken cancel = default) =>
        _table.FindBySha256Async(sha256, cancel);

    /// <summary>Removes a station and its record; false when there is no such station.</summary>
    public Task<bool> DeleteAsync(string nameOrSlug, CancellationToken cancel = default) => _table.DeleteAsync(nameOrSlug, s => s.Id, cancel);

    /// <summary>A station's whole record in time order, streamed out by binary COPY.</summary>
    public async Task<StationObservationColumns> ObservationsAsync(int stationId, CancellationToken cancel = default)
    {
        var times = new List<long>();
        var hs = new List<float>();
        var tp = new List<float>();
        var te = new List<float>();
        var dir = new List<float>();
        var qc = new List<short>();
        await using var connection = await dataSource.OpenConnectionAsync(cancel);
        await using (var reader = await connection.BeginBinaryExportAsync(
            $"COPY (SELECT extract(epoch FROM time)::bigint, hs, tp, te, dir, qc FROM station_observation WHERE station_id = {stationId:D} ORDER BY time) TO STDOUT (FORMAT BINARY)", cancel))
        {
            while (await reader.StartRowAsync(cancel) != -1)
            {
                times.Add(await reader.ReadAsync<long>(NpgsqlDbType.Bigint, cancel));
                hs.Add(await ReadValueAsync(reader, cancel));
                tp.Add(await ReadValueAsync(reader, cancel));
                te.Add(await ReadValueAsync(reader, cancel));
                dir.Add(await ReadValueAsync(reader, cancel));
                qc.Add(await reader.ReadAsync<short>(NpgsqlDbType.Smallint, cancel));
            }
        }
        return new StationObservationColumns([.. times], [.. hs], [.. tp], [.. te], [.. dir], [.. qc]);
    }

    public static string RoleName(StationRole role) => role == StationRole.Calibration ? "calibration" : "validation";

    /// <summary>Parses <c>calibration</c> or <c>validation</c> (any case); false for anything else.</summary>
    public static bool TryParseRole(string? text, out StationRole role)
    {
        role = StationRole.Calibration;
        switch (text?.Trim().ToLowerInvariant())
        {
            case "calibration": role = StationRole.Calibration; return true;
            case "validation": role = StationRole.Validation; return true;
            default: return false;
        }
    }

    private static async Task WriteValueAsync(NpgsqlBinaryImporter writer, float value, CancellationToken cancel)
    {
        if (float.IsNaN(value)) await writer.WriteNullAsync(cancel);
        else await writer.WriteAsync(value, NpgsqlDbType.Real, cancel);
    }

    private static async Task<float> ReadValueAsync(NpgsqlBinaryExporter reader, CancellationToken cancel)
    {
        if (reader.IsNull)
        {
            await reader.SkipAsync(cancel);
            return float.NaN;
        }
        return await reader.ReadAsync<float>(NpgsqlDbType.Real, cancel);
    }

    private static StoredStation Read(NpgsqlDataReader reader) => new(
        reader.GetInt32(0),
        new StationDefinition(
            reader.GetString(1), reader.GetString(2), reader.GetDouble(3), reader.GetDouble(4),
            reader.IsDBNull(5) ? null : reader.GetFloat(5), reader.GetString(6),
            reader.GetString(7) == "calibration" ? StationRole.Calibration : StationRole.Validation,
            reader.GetString(8), reader.GetString(9), reader.GetString(10),
            reader.GetBoolean(13), reader.GetBoolean(14), reader.GetBoolean(15)),
        reader.GetInt32(11), reader.GetInt32(12),
        reader.GetDateTime(16).ToUniversalTime(), reader.GetDateTime(17).ToUniversalTime(), reader.GetDateTime(18).ToUniversalTime());
}
