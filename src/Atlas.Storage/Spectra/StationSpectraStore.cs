using Npgsql;

namespace Atlas.Storage.Spectra;

/// <summary>The spectral values of output points kept beside their series: per-step values and monthly sums (V6 schema).</summary>
public sealed class StationSpectraStore(NpgsqlDataSource dataSource)
{
    /// <summary>Writes (or replaces) station-years of per-step values inside the caller's transaction.</summary>
    public static async Task UpsertStepsAsync(NpgsqlConnection connection, NpgsqlTransaction transaction, int datasetId,
        IEnumerable<StationStepRecord> records, CancellationToken cancel)
    {
        const string sql = """
            INSERT INTO station_step (dataset_id, cell_id, year, j_spectral, j_parametric, directionality, max_power_from, spectral_width)
            VALUES ($1, $2, $3, $4, $5, $6, $7, $8)
            ON CONFLICT (dataset_id, cell_id, year) DO UPDATE SET j_spectral = excluded.j_spectral, j_parametric = excluded.j_parametric,
                directionality = excluded.directionality, max_power_from = excluded.max_power_from, spectral_width = excluded.spectral_width
            """;
        var batch = new NpgsqlBatch(connection, transaction);
        foreach (var r in records)
        {
            var command = new NpgsqlBatchCommand(sql);
            command.Parameters.AddWithValue(datasetId);
            command.Parameters.AddWithValue(r.CellId);
            command.Parameters.AddWithValue((short)r.Year);
            command.Parameters.AddWithValue(r.PowerSpectral);
            command.Parameters.AddWithValue(r.PowerParametric);
            command.Parameters.AddWithValue(r.Directionality);
            command.Parameters.AddWithValue(r.MaximumPowerFrom);
            command.Parameters.AddWithValue(r.SpectralWidth);
            batch.BatchCommands.Add(command);
        }
        await using (batch)
            if (batch.BatchCommands.Count > 0) await batch.ExecuteNonQueryAsync(cancel);
    }

    /// <summary>The per-step values of the given years, by (cell, year); inside the caller's transaction when given.</summary>
    public static async Task<Dictionary<(int Cell, int Year), StationStepRecord>> ReadStepsAsync(NpgsqlConnection connection,
        NpgsqlTransaction? transaction, int datasetId, int[]? years, int? cellId, CancellationToken cancel)
    {
        await using var command = new NpgsqlCommand("""
            SELECT cell_id, year, j_spectral, j_parametric, directionality, max_power_from, spectral_width FROM station_step
            WHERE dataset_id = $1 AND ($2::smallint[] IS NULL OR year = ANY($2)) AND ($3::integer IS NULL OR cell_id = $3)
            """, connection, transaction);
        command.Parameters.AddWithValue(datasetId);
        command.Parameters.Add(new NpgsqlParameter { Value = (object?)years?.Select(y => (short)y).ToArray() ?? DBNull.Value, NpgsqlDbType = NpgsqlTypes.NpgsqlDbType.Array | NpgsqlTypes.NpgsqlDbType.Smallint });
        command.Parameters.Add(new NpgsqlParameter { Value = (object?)cellId ?? DBNull.Value, NpgsqlDbType = NpgsqlTypes.NpgsqlDbType.Integer });
        var result = new Dictionary<(int, int), StationStepRecord>();
        await using var reader = await command.ExecuteReaderAsync(cancel);
        while (await reader.ReadAsync(cancel))
        {
            var record = new StationStepRecord(reader.GetInt32(0), reader.GetInt16(1), reader.GetFieldValue<float[]>(2), reader.GetFieldValue<float[]>(3),
                reader.GetFieldValue<float[]>(4), reader.GetFieldValue<float[]>(5), reader.GetFieldValue<float[]>(6));
            result[(record.CellId, record.Year)] = record;
        }
        return result;
    }

    /// <summary>The per-step values of every stored year of one station.</summary>
    public async Task<IReadOnlyDictionary<int, StationStepRecord>> StepsOfStationAsync(int datasetId, int cellId, CancellationToken cancel)
    {
        await using var connection = await dataSource.OpenConnectionAsync(cancel);
        var all = await ReadStepsAsync(connection, null, datasetId, null, cellId, cancel);
        return all.Values.ToDictionary(r => r.Year);
    }

    /// <summary>Adds the given monthly sums to the stored ones (rows created where missing) inside the caller's transaction.</summary>
    public static async Task AddMonthSumsAsync(NpgsqlConnection connection, NpgsqlTransaction transaction, int datasetId,
        IEnumerable<StationMonthSums> sums, CancellationToken cancel)
    {
        const string sql = """
            INSERT INTO station_spectrum_month AS m (dataset_id, cell_id, year, month, steps, frequency_sum, direction_sum)
            VALUES ($1, $2, $3, $4, $5, $6, $7)
            ON CONFLICT (dataset_id, cell_id, year, month) DO UPDATE SET
                steps = m.steps + excluded.steps,
                frequency_sum = (SELECT array_agg(a + b ORDER BY k) FROM unnest(m.frequency_sum, excluded.frequency_sum) WITH ORDINALITY AS u(a, b, k)),
                direction_sum = coalesce((SELECT array_agg(a + b ORDER BY k) FROM unnest(m.direction_sum, excluded.direction_sum) WITH ORDINALITY AS u(a, b, k)), '{}')
            """;
        var batch = new NpgsqlBatch(connection, transaction);
        foreach (var s in sums)
        {
            var command = new NpgsqlBatchCommand(sql);
            command.Parameters.AddWithValue(datasetId);
            command.Parameters.AddWithValue(s.CellId);
            command.Parameters.AddWithValue((short)s.Year);
            command.Parameters.AddWithValue((short)s.Month);
            command.Parameters.AddWithValue(s.Steps);
            command.Parameters.AddWithValue(s.FrequencySum);
            command.Parameters.AddWithValue(s.DirectionSum);
            batch.BatchCommands.Add(command);
        }
        await using (batch)
            if (batch.BatchCommands.Count > 0) await batch.ExecuteNonQueryAsync(cancel);
    }

    /// <summary>The monthly sums of one station, every stored month.</summary>
    public async Task<IReadOnlyList<StationMonthSums>> MonthSumsAsync(int datasetId, int cellId, CancellationToken cancel)
    {
        await using var connection = await dataSource.OpenConnectionAsync(cancel);
        await using var command = new NpgsqlCommand("""
            SELECT year, month, steps, frequency_sum, direction_sum FROM station_spectrum_month
            WHERE dataset_id = $1 AND cell_id = $2 ORDER BY year, month
            """, connection);
        command.Parameters.AddWithValue(datasetId);
        command.Parameters.AddWithValue(cellId);
        var result = new List<StationMonthSums>();
        await using var reader = await command.ExecuteReaderAsync(cancel);
        while (await reader.ReadAsync(cancel))
            result.Add(new StationMonthSums(cellId, reader.GetInt16(0), reader.GetInt16(1), reader.GetInt32(2),
                reader.GetFieldValue<double[]>(3), reader.GetFieldValue<double[]>(4)));
        return result;
    }
}
