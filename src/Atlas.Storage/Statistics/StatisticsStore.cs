using Atlas.Storage.Copy;
using Atlas.Storage.Cells;
using Npgsql;
using NpgsqlTypes;

namespace Atlas.Storage.Statistics;

/// <summary>Per-cell statistics by period and parameter, and the record of when each cell was computed.</summary>
public sealed class StatisticsStore(NpgsqlDataSource dataSource)
{
    /// <summary>
    /// Replaces the statistics of the given cells in one transaction: deletes their old rows, COPYs the new ones,
    /// and stamps them computed at <paramref name="computedAtUtc"/>.
    /// </summary>
    public async Task ReplaceAsync(int datasetId, IReadOnlyList<int> cellIds, IReadOnlyList<StatisticRow> rows, DateTime computedAtUtc, CancellationToken cancel = default)
    {
        await using var connection = await dataSource.OpenConnectionAsync(cancel);
        await using var transaction = await connection.BeginTransactionAsync(cancel);
        var ids = cellIds.ToArray();
        foreach (var table in new[] { "cell_statistic", "cell_statistic_state" })
        {
            await using var delete = new NpgsqlCommand($"DELETE FROM {table} WHERE dataset_id = $1 AND cell_id = ANY($2)", connection, transaction);
            delete.Parameters.AddWithValue(datasetId);
            delete.Parameters.AddWithValue(ids);
            await delete.ExecuteNonQueryAsync(cancel);
        }
        await using (var copy = await connection.BeginRawBinaryCopyAsync(
            "COPY cell_statistic (dataset_id, cell_id, period, parameter, mean, sd, min, max, p10, p50, p90, p99, count, coverage, extra) FROM STDIN (FORMAT BINARY)", cancel))
        {
            // Encoded here rather than field by field through the typed importer: the rows are many and small, and
            // per-field calls cost more than the database's own work on them.
            var encoder = new BinaryCopyEncoder(copy);
            encoder.WriteHeader();
            foreach (var row in rows)
            {
                cancel.ThrowIfCancellationRequested();
                encoder.StartRow(15);
                encoder.WriteInt32(datasetId);
                encoder.WriteInt32(row.CellId);
                encoder.WriteInt16(row.Period);
                encoder.WriteInt16(row.Parameter);
                encoder.WriteReal(row.Mean);
                encoder.WriteReal(row.Sd);
                encoder.WriteReal(row.Min);
                encoder.WriteReal(row.Max);
                encoder.WriteReal(row.P10);
                encoder.WriteReal(row.P50);
                encoder.WriteReal(row.P90);
                encoder.WriteReal(row.P99);
                encoder.WriteInt32(row.Count);
                encoder.WriteReal(row.Coverage);
                encoder.WriteRealArray(row.Extra);
            }
            encoder.WriteTrailer();
        }
        await using (var writer = await connection.BeginBinaryImportAsync(
            "COPY cell_statistic_state (dataset_id, cell_id, computed_at) FROM STDIN (FORMAT BINARY)", cancel))
        {
            foreach (var id in ids)
            {
                await writer.StartRowAsync(cancel);
                await writer.WriteAsync(datasetId, NpgsqlDbType.Integer, cancel);
                await writer.WriteAsync(id, NpgsqlDbType.Integer, cancel);
                await writer.WriteAsync(computedAtUtc, NpgsqlDbType.TimestampTz, cancel);
            }
            await writer.CompleteAsync(cancel);
        }
        await using (var clear = new NpgsqlCommand("DELETE FROM layer_cache WHERE dataset_id = $1", connection, transaction))
        {
            clear.Parameters.AddWithValue(datasetId);
            await clear.ExecuteNonQueryAsync(cancel);
        }
        await transaction.CommitAsync(cancel);
    }

    /// <summary>Wet cells whose series were written after their statistics were computed (or never computed).</summary>
    public async Task<int[]> StaleCellsAsync(int datasetId, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand("""
            SELECT c.cell_id FROM cell c
              LEFT JOIN cell_statistic_state s ON s.dataset_id = c.dataset_id AND s.cell_id = c.cell_id
             WHERE c.dataset_id = $1 AND c.wet
               AND (s.computed_at IS NULL OR EXISTS (
                    SELECT 1 FROM series_chunk k
                     WHERE k.dataset_id = c.dataset_id AND k.cell_id = c.cell_id AND k.written_at > s.computed_at))
             ORDER BY c.cell_id
            """);
        command.Parameters.AddWithValue(datasetId);
        var ids = new List<int>();
        await using var reader = await command.ExecuteReaderAsync(cancel);
        while (await reader.ReadAsync(cancel)) ids.Add(reader.GetInt32(0));
        return ids.ToArray();
    }

    /// <summary>Every statistic row of one cell (all periods and parameters).</summary>
    public async Task<IReadOnlyList<StatisticRow>> ForCellAsync(int datasetId, int cellId, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand($"""
            SELECT cell_id, period, parameter, mean, sd, min, max, p10, p50, p90, p99, count, coverage, extra
              FROM cell_statistic WHERE dataset_id = $1 AND cell_id = $2 ORDER BY period, parameter
            """);
        command.Parameters.AddWithValue(datasetId);
        command.Parameters.AddWithValue(cellId);
        var rows = new List<StatisticRow>();
        await using var reader = await command.ExecuteReaderAsync(cancel);
        while (await reader.ReadAsync(cancel))
        {
            float? F(int i) => reader.IsDBNull(i) ? null : reader.GetFloat(i);
            rows.Add(new StatisticRow(reader.GetInt32(0), reader.GetInt16(1), reader.GetInt16(2), F(3), F(4), F(5), F(6), F(7), F(8), F(9), F(10),
                reader.GetInt32(11), reader.GetFloat(12), reader.IsDBNull(13) ? null : reader.GetFieldValue<float[]>(13)));
        }
        return rows;
    }

    /// <summary>
    /// One layer: the chosen statistic of a parameter over a period for every wet cell that has it, with positions,
    /// by cell id. Positions come from <paramref name="cellOf"/> when given (the caller's copy of the dataset's
    /// cells: reading only the statistics rows spares the database a join with every cell; rows of cells it does not
    /// know are left out), else from the cell table by a join. <paramref name="extraIndex"/> reads element (1-based)
    /// of the extra array instead of a column (exceedance).
    /// </summary>
    public async Task<IReadOnlyList<LayerValue>> LayerAsync(int datasetId, short parameter, short period, StoredStatistic statistic,
        Func<int, CellRecord?>? cellOf, int? extraIndex = null, CancellationToken cancel = default)
    {
        var column = extraIndex is { } k ? $"s.extra[{k:D}]" : "s." + statistic.ToString().ToLowerInvariant();
        await using var command = dataSource.CreateCommand(cellOf is null
            ? $"""
              SELECT s.cell_id, {column}::float8, ST_X(c.geom), ST_Y(c.geom), c.grid_i, c.grid_j, c.depth_m
                FROM cell_statistic s JOIN cell c ON c.dataset_id = s.dataset_id AND c.cell_id = s.cell_id
               WHERE s.dataset_id = $1 AND s.parameter = $2 AND s.period = $3 AND {column} IS NOT NULL
              """
            : $"""
              SELECT s.cell_id, {column}::float8 FROM cell_statistic s
               WHERE s.dataset_id = $1 AND s.parameter = $2 AND s.period = $3 AND {column} IS NOT NULL
              """);
        command.Parameters.AddWithValue(datasetId);
        command.Parameters.AddWithValue(parameter);
        command.Parameters.AddWithValue(period);
        var values = new List<LayerValue>();
        await using var reader = await command.ExecuteReaderAsync(cancel);
        while (await reader.ReadAsync(cancel))
        {
            int cellId = reader.GetInt32(0);
            double value = reader.GetDouble(1);
            if (cellOf is null)
                values.Add(new LayerValue(cellId, reader.GetDouble(2), reader.GetDouble(3), reader.IsDBNull(4) ? null : reader.GetInt32(4),
                    reader.IsDBNull(5) ? null : reader.GetInt32(5), reader.IsDBNull(6) ? null : reader.GetFloat(6), value));
            else if (cellOf(cellId) is { } c)
                values.Add(new LayerValue(cellId, c.Longitude, c.Latitude, c.GridI, c.GridJ, c.DepthMetres, value));
        }
        // Ordered here rather than by the database, whose sort of a large layer costs more than the scan itself.
        values.Sort((a, b) => a.CellId.CompareTo(b.CellId));
        return values;
    }

    /// <summary>The periods that have statistics in a dataset.</summary>
    public async Task<IReadOnlyList<short>> PeriodsAsync(int datasetId, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand(
            "SELECT DISTINCT period FROM cell_statistic WHERE dataset_id = $1 AND parameter = 0 ORDER BY period");
        command.Parameters.AddWithValue(datasetId);
        var periods = new List<short>();
        await using var reader = await command.ExecuteReaderAsync(cancel);
        while (await reader.ReadAsync(cancel)) periods.Add(reader.GetInt16(0));
        return periods;
    }
}
