using Npgsql;
using NpgsqlTypes;

namespace Atlas.Storage.Datasets;

/// <summary>Datasets, their yearly time lines and their source files.</summary>
public sealed class DatasetStore(NpgsqlDataSource dataSource)
{
    private const string Columns = "dataset_id, slug, title, grid_kind, nx, ny, point_count, grid::text, metadata::text, created_at";

    public async Task<IReadOnlyList<DatasetRecord>> ListAsync(CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand($"SELECT {Columns} FROM dataset ORDER BY slug");
        return await ReadAllAsync(command, cancel);
    }

    public async Task<DatasetRecord?> FindByIdAsync(int id, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand($"SELECT {Columns} FROM dataset WHERE dataset_id = $1");
        command.Parameters.AddWithValue(id);
        var rows = await ReadAllAsync(command, cancel);
        return rows.Count == 0 ? null : rows[0];
    }

    public async Task<DatasetRecord?> FindAsync(string slug, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand($"SELECT {Columns} FROM dataset WHERE slug = $1");
        command.Parameters.AddWithValue(slug);
        var rows = await ReadAllAsync(command, cancel);
        return rows.Count == 0 ? null : rows[0];
    }

    /// <summary>
    /// Takes the dataset's ingest lock for the rest of the transaction: one ingest per dataset at a time, whichever
    /// worker or machine runs it; another waits here until the first commits or rolls back.
    /// </summary>
    public static async Task LockForIngestAsync(NpgsqlConnection connection, NpgsqlTransaction transaction, string slug, CancellationToken cancel)
    {
        await using var command = new NpgsqlCommand($"SELECT pg_advisory_xact_lock({IngestLockKey})", connection, transaction);
        command.Parameters.AddWithValue(slug);
        await command.ExecuteNonQueryAsync(cancel);
    }

    /// <summary>The advisory-lock key of a dataset's ingest, from the slug in parameter $1.</summary>
    private const string IngestLockKey = "hashtext('atlas-ingest:' || $1)";

    public static async Task<DatasetRecord?> FindAsync(NpgsqlConnection connection, NpgsqlTransaction? transaction, string slug, CancellationToken cancel)
    {
        await using var command = new NpgsqlCommand($"SELECT {Columns} FROM dataset WHERE slug = $1", connection, transaction);
        command.Parameters.AddWithValue(slug);
        var rows = await ReadAllAsync(command, cancel);
        return rows.Count == 0 ? null : rows[0];
    }

    /// <summary>
    /// Inserts a dataset and returns its id: a new one, or <paramref name="reservedId"/> (taken from the id sequence
    /// earlier by an ingest in parts, whose series already carry it). The caller's transaction makes it visible with its data.
    /// </summary>
    public static async Task<int> InsertAsync(NpgsqlConnection connection, NpgsqlTransaction transaction, string slug, string title,
        string gridKind, int? nx, int? ny, int pointCount, string gridJson, string metadataJson, CancellationToken cancel, int? reservedId = null)
    {
        await using var command = new NpgsqlCommand("""
            INSERT INTO dataset (dataset_id, slug, title, grid_kind, nx, ny, point_count, grid, metadata) OVERRIDING SYSTEM VALUE
            VALUES (coalesce($9, nextval(pg_get_serial_sequence('dataset', 'dataset_id'))::int), $1, $2, $3, $4, $5, $6, $7::jsonb, $8::jsonb)
            RETURNING dataset_id
            """, connection, transaction);
        command.Parameters.AddWithValue(slug);
        command.Parameters.AddWithValue(title);
        command.Parameters.AddWithValue(gridKind);
        command.Parameters.AddWithValue(NpgsqlDbType.Integer, (object?)nx ?? DBNull.Value);
        command.Parameters.AddWithValue(NpgsqlDbType.Integer, (object?)ny ?? DBNull.Value);
        command.Parameters.AddWithValue(pointCount);
        command.Parameters.AddWithValue(gridJson);
        command.Parameters.AddWithValue(metadataJson);
        command.Parameters.AddWithValue(NpgsqlDbType.Integer, (object?)reservedId ?? DBNull.Value);
        return (int)(await command.ExecuteScalarAsync(cancel))!;
    }

    /// <summary>Merges <paramref name="metadataJson"/> (a JSON object) into the dataset's metadata, key by key.</summary>
    public static async Task MergeMetadataAsync(NpgsqlConnection connection, NpgsqlTransaction? transaction, int datasetId, string metadataJson, CancellationToken cancel)
    {
        await using var command = new NpgsqlCommand(
            "UPDATE dataset SET metadata = metadata || $2::jsonb WHERE dataset_id = $1", connection, transaction);
        command.Parameters.AddWithValue(datasetId);
        command.Parameters.AddWithValue(metadataJson);
        await command.ExecuteNonQueryAsync(cancel);
    }

    public async Task MergeMetadataAsync(int datasetId, string metadataJson, CancellationToken cancel = default)
    {
        await using var connection = await dataSource.OpenConnectionAsync(cancel);
        await MergeMetadataAsync(connection, null, datasetId, metadataJson, cancel);
    }

    public static async Task UpdateExtentAsync(NpgsqlConnection connection, NpgsqlTransaction transaction, int datasetId, CancellationToken cancel)
    {
        await using var command = new NpgsqlCommand("""
            UPDATE dataset d SET extent = (SELECT ST_Envelope(ST_Collect(geom))::geometry(Polygon, 4326)
                                          FROM cell c WHERE c.dataset_id = d.dataset_id AND c.wet)
            WHERE d.dataset_id = $1
            """, connection, transaction);
        command.Parameters.AddWithValue(datasetId);
        await command.ExecuteNonQueryAsync(cancel);
    }

    /// <summary>
    /// Deletes a dataset and every row keyed by it (per-cell tables, statistic blocks, time lines, source files, layer
    /// cache, and its jobs) in one transaction. Refuses, changing nothing, while an ingest holds the dataset's lock or
    /// one of its jobs is running: removing under a running pass would leave the pass writing rows of a dataset that
    /// is gone.
    /// </summary>
    public async Task<DatasetRemoval> DeleteAsync(string slug, CancellationToken cancel = default)
    {
        await using var connection = await dataSource.OpenConnectionAsync(cancel);
        await using var transaction = await connection.BeginTransactionAsync(cancel);
        var dataset = await FindAsync(connection, transaction, slug, cancel);
        if (dataset is null) return DatasetRemoval.Unknown;
        // Held to the end of this transaction, so no ingest of the dataset starts while it is removed.
        await using (var lockCommand = new NpgsqlCommand($"SELECT pg_try_advisory_xact_lock({IngestLockKey})", connection, transaction))
        {
            lockCommand.Parameters.AddWithValue(slug);
            if (!(bool)(await lockCommand.ExecuteScalarAsync(cancel))!) return new DatasetRemoval(DatasetRemovalOutcome.Busy, []);
        }
        // Jobs that are not running go first: the delete locks them, so a worker's claim (which skips locked rows)
        // cannot start one of them now; a claim already under way is waited for and then seen as running below.
        await using (var jobs = new NpgsqlCommand("DELETE FROM job WHERE dataset_slug = $1 AND state <> 'running'", connection, transaction))
        {
            jobs.Parameters.AddWithValue(slug);
            await jobs.ExecuteNonQueryAsync(cancel);
        }
        var running = new List<long>();
        await using (var runningCommand = new NpgsqlCommand(
            "SELECT job_id FROM job WHERE dataset_slug = $1 AND state = 'running' ORDER BY job_id", connection, transaction))
        {
            runningCommand.Parameters.AddWithValue(slug);
            await using var reader = await runningCommand.ExecuteReaderAsync(cancel);
            while (await reader.ReadAsync(cancel)) running.Add(reader.GetInt64(0));
        }
        if (running.Count > 0) return new DatasetRemoval(DatasetRemovalOutcome.Busy, running);
        foreach (var table in PerCellTables.Append(StatisticBlockTable).Append(StatisticStageTable))
        {
            await using var delete = new NpgsqlCommand($"DELETE FROM {table} WHERE dataset_id = $1", connection, transaction);
            delete.Parameters.AddWithValue(dataset.Id);
            await delete.ExecuteNonQueryAsync(cancel);
        }
        // Passes name the dataset by id and slug without a foreign key (an ingest pass comes before its dataset row);
        // the jobs of their parts follow them.
        await using (var passes = new NpgsqlCommand("DELETE FROM pass WHERE dataset_slug = $1", connection, transaction))
        {
            passes.Parameters.AddWithValue(slug);
            await passes.ExecuteNonQueryAsync(cancel);
        }
        // dataset_year, source_file and layer_cache follow by ON DELETE CASCADE.
        await using (var command = new NpgsqlCommand("DELETE FROM dataset WHERE dataset_id = $1", connection, transaction))
        {
            command.Parameters.AddWithValue(dataset.Id);
            await command.ExecuteNonQueryAsync(cancel);
        }
        await transaction.CommitAsync(cancel);
        return DatasetRemoval.Removed;
    }

    /// <summary>The space the dataset's series and statistics take (see <see cref="DatasetStorage"/> for how it is counted).</summary>
    public async Task<DatasetStorage> StorageAsync(int datasetId, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand("""
            SELECT (SELECT count(*) FROM series_chunk WHERE dataset_id = $1),
                   (SELECT coalesce(sum(pg_column_size(payload)), 0) FROM series_chunk WHERE dataset_id = $1)::bigint,
                   (SELECT count(*) FROM statistic_block WHERE dataset_id = $1),
                   (SELECT coalesce(sum(pg_column_size(s.*)), 0) FROM statistic_block s WHERE dataset_id = $1)::bigint,
                   (SELECT count(*) FROM station_step WHERE dataset_id = $1),
                   (SELECT coalesce(sum(pg_column_size(s.*)), 0) FROM station_step s WHERE dataset_id = $1)::bigint,
                   (SELECT count(*) FROM station_spectrum_month WHERE dataset_id = $1),
                   (SELECT coalesce(sum(pg_column_size(s.*)), 0) FROM station_spectrum_month s WHERE dataset_id = $1)::bigint
            """);
        command.Parameters.AddWithValue(datasetId);
        await using var reader = await command.ExecuteReaderAsync(cancel);
        await reader.ReadAsync(cancel);
        return new DatasetStorage(reader.GetInt64(0), reader.GetInt64(1), reader.GetInt64(2), reader.GetInt64(3))
        {
            SpectralYearCount = reader.GetInt64(4),
            SpectralBytes = reader.GetInt64(5),
            SpectrumMonthCount = reader.GetInt64(6),
            SpectrumMonthBytes = reader.GetInt64(7),
        };
    }

    /// <summary>Tables keyed by cell, which carry no foreign key to dataset (so they can be distributed by cell).</summary>
    public static readonly string[] PerCellTables = ["series_chunk", "cell_statistic_state", "mesh_triangle", "cell"];

    /// <summary>
    /// Statistics, keyed by dataset and block of cells (<see cref="Statistics.StatisticBlock"/>) rather than by cell;
    /// like the per-cell tables it carries no foreign key to dataset.
    /// </summary>
    public const string StatisticBlockTable = "statistic_block";

    /// <summary>Statistic blocks of passes in parts not yet finished (<see cref="Passes.PassStore"/>), keyed by pass, dataset and block.</summary>
    public const string StatisticStageTable = "statistic_block_stage";

    public async Task<DatasetSummary?> SummariseAsync(string slug, CancellationToken cancel = default)
    {
        var dataset = await FindAsync(slug, cancel);
        if (dataset is null) return null;
        await using var command = dataSource.CreateCommand("""
            SELECT (SELECT count(*) FROM cell WHERE dataset_id = $1 AND wet)::int,
                   ST_XMin(d.extent), ST_YMin(d.extent), ST_XMax(d.extent), ST_YMax(d.extent),
                   (SELECT to_timestamp(min(times[1])) FROM dataset_year WHERE dataset_id = $1),
                   (SELECT to_timestamp(max(times[cardinality(times)])) FROM dataset_year WHERE dataset_id = $1),
                   (SELECT coalesce(sum(cardinality(times)), 0) FROM dataset_year WHERE dataset_id = $1)::int,
                   (SELECT times[1:least(cardinality(times), 2000)] FROM dataset_year WHERE dataset_id = $1 ORDER BY year LIMIT 1),
                   (SELECT coalesce(array_agg(year ORDER BY year), '{}') FROM dataset_year WHERE dataset_id = $1),
                   (SELECT count(*) FROM cell_statistic_state WHERE dataset_id = $1)::int
              FROM dataset d WHERE d.dataset_id = $1
            """);
        command.Parameters.AddWithValue(dataset.Id);
        await using var reader = await command.ExecuteReaderAsync(cancel);
        await reader.ReadAsync(cancel);
        double? Get(int i) => reader.IsDBNull(i) ? null : reader.GetDouble(i);
        DateTime? Time(int i) => reader.IsDBNull(i) ? null : reader.GetDateTime(i).ToUniversalTime();
        return new DatasetSummary(dataset, reader.GetInt32(0), Get(1), Get(2), Get(3), Get(4), Time(5), Time(6),
            reader.GetInt32(7), reader.IsDBNull(8) ? null : MedianStep(reader.GetFieldValue<long[]>(8)),
            reader.GetFieldValue<short[]>(9).Select(y => (int)y).ToArray(), reader.GetInt32(10));
    }

    /// <summary>The median spacing of a time line's first steps, seconds; null for fewer than two steps.</summary>
    private static int? MedianStep(long[] times)
    {
        if (times.Length < 2) return null;
        var steps = new long[times.Length - 1];
        for (var i = 1; i < times.Length; i++) steps[i - 1] = times[i] - times[i - 1];
        Array.Sort(steps);
        return (int)steps[steps.Length / 2];
    }

    public async Task<IReadOnlyList<SourceFileRecord>> SourceFilesAsync(int datasetId, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand("""
            SELECT file_name, checksum, size_bytes, time_start, time_end, step_count, job_id, loaded_at
              FROM source_file WHERE dataset_id = $1 ORDER BY time_start, file_name
            """);
        command.Parameters.AddWithValue(datasetId);
        var files = new List<SourceFileRecord>();
        await using var reader = await command.ExecuteReaderAsync(cancel);
        while (await reader.ReadAsync(cancel))
            files.Add(new SourceFileRecord(reader.GetString(0), reader.GetString(1), reader.GetInt64(2),
                reader.GetDateTime(3).ToUniversalTime(), reader.GetDateTime(4).ToUniversalTime(), reader.GetInt32(5),
                reader.IsDBNull(6) ? null : reader.GetInt64(6), reader.GetDateTime(7).ToUniversalTime()));
        return files;
    }

    public static async Task<HashSet<string>> LoadedChecksumsAsync(NpgsqlConnection connection, NpgsqlTransaction? transaction, int datasetId, CancellationToken cancel)
    {
        await using var command = new NpgsqlCommand("SELECT checksum FROM source_file WHERE dataset_id = $1", connection, transaction);
        command.Parameters.AddWithValue(datasetId);
        var set = new HashSet<string>(StringComparer.OrdinalIgnoreCase);
        await using var reader = await command.ExecuteReaderAsync(cancel);
        while (await reader.ReadAsync(cancel)) set.Add(reader.GetString(0));
        return set;
    }

    public static async Task InsertSourceFileAsync(NpgsqlConnection connection, NpgsqlTransaction transaction, int datasetId,
        SourceFileRecord file, CancellationToken cancel)
    {
        await using var command = new NpgsqlCommand("""
            INSERT INTO source_file (dataset_id, file_name, checksum, size_bytes, time_start, time_end, step_count, job_id)
            VALUES ($1, $2, $3, $4, $5, $6, $7, $8)
            """, connection, transaction);
        command.Parameters.AddWithValue(datasetId);
        command.Parameters.AddWithValue(file.FileName);
        command.Parameters.AddWithValue(file.Checksum);
        command.Parameters.AddWithValue(file.SizeBytes);
        command.Parameters.AddWithValue(file.TimeStartUtc);
        command.Parameters.AddWithValue(file.TimeEndUtc);
        command.Parameters.AddWithValue(file.StepCount);
        command.Parameters.AddWithValue(NpgsqlDbType.Bigint, (object?)file.JobId ?? DBNull.Value);
        await command.ExecuteNonQueryAsync(cancel);
    }

    /// <summary>The stored time line of every year of a dataset (Unix seconds), by year.</summary>
    public static async Task<SortedDictionary<int, long[]>> TimelinesAsync(NpgsqlConnection connection, NpgsqlTransaction? transaction, int datasetId, CancellationToken cancel)
    {
        await using var command = new NpgsqlCommand("SELECT year, times FROM dataset_year WHERE dataset_id = $1 ORDER BY year", connection, transaction);
        command.Parameters.AddWithValue(datasetId);
        var result = new SortedDictionary<int, long[]>();
        await using var reader = await command.ExecuteReaderAsync(cancel);
        while (await reader.ReadAsync(cancel)) result[reader.GetInt16(0)] = reader.GetFieldValue<long[]>(1);
        return result;
    }

    public async Task<SortedDictionary<int, long[]>> TimelinesAsync(int datasetId, CancellationToken cancel = default)
    {
        await using var connection = await dataSource.OpenConnectionAsync(cancel);
        return await TimelinesAsync(connection, null, datasetId, cancel);
    }

    public static async Task UpsertTimelineAsync(NpgsqlConnection connection, NpgsqlTransaction transaction, int datasetId, int year, long[] times, CancellationToken cancel)
    {
        await using var command = new NpgsqlCommand("""
            INSERT INTO dataset_year (dataset_id, year, times) VALUES ($1, $2, $3)
            ON CONFLICT (dataset_id, year) DO UPDATE SET times = excluded.times
            """, connection, transaction);
        command.Parameters.AddWithValue(datasetId);
        command.Parameters.AddWithValue((short)year);
        command.Parameters.AddWithValue(times);
        await command.ExecuteNonQueryAsync(cancel);
    }

    private static async Task<IReadOnlyList<DatasetRecord>> ReadAllAsync(NpgsqlCommand command, CancellationToken cancel)
    {
        var rows = new List<DatasetRecord>();
        await using var reader = await command.ExecuteReaderAsync(cancel);
        while (await reader.ReadAsync(cancel))
            rows.Add(new DatasetRecord(reader.GetInt32(0), reader.GetString(1), reader.GetString(2), reader.GetString(3),
                reader.IsDBNull(4) ? null : reader.GetInt32(4), reader.IsDBNull(5) ? null : reader.GetInt32(5),
                reader.GetInt32(6), reader.GetString(7), reader.GetString(8), reader.GetDateTime(9).ToUniversalTime()));
        return rows;
    }
}
