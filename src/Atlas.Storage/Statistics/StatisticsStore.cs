using Atlas.Storage.Copy;
using Atlas.Storage.Cells;
using Npgsql;
using NpgsqlTypes;

namespace Atlas.Storage.Statistics;

/// <summary>
/// Per-cell statistics by period and parameter, stored period-major in blocks of cells (<see cref="StatisticBlock"/>;
/// the view <c>cell_statistic</c> shows them one row per cell), and the record of when each cell was computed.
/// </summary>
public sealed class StatisticsStore(NpgsqlDataSource dataSource)
{
    /// <summary>The columns of a stored block after dataset_id (statistic_block and the pass staging table share them).</summary>
    public const string BlockColumns = "parameter, period, block, cell_ids, count, coverage, mean, sd, min, max, p10, p50, p90, p99, extra_width, extra";

    /// <summary>
    /// Replaces the statistics of the given cells in one transaction and stamps them computed at
    /// <paramref name="computedAtUtc"/>. The blocks they fall in are rewritten whole: rows of other cells in those
    /// blocks are kept (read back and packed again with the new rows). Cells given without rows lose their statistics.
    /// Concurrent calls must hold disjoint blocks.
    /// </summary>
    public Task ReplaceAsync(int datasetId, IReadOnlyList<int> cellIds, IReadOnlyList<StatisticRow> rows, DateTime computedAtUtc, CancellationToken cancel = default)
    {
        var replaced = cellIds.ToHashSet();
        foreach (var row in rows)
            if (!replaced.Contains(row.CellId))
                throw new ArgumentException($"Row for cell {row.CellId}, which is not among the cells being replaced.", nameof(rows));
        return ReplaceBlocksAsync(datasetId, cellIds, StatisticBlock.Pack(rows), computedAtUtc, cancel);
    }

    /// <summary>
    /// <see cref="ReplaceAsync"/> with the new statistics already packed (every cell in <paramref name="blocks"/> must be
    /// among <paramref name="cellIds"/>). Handing over whole blocks saves reading back the rows of other cells.
    /// </summary>
    public async Task ReplaceBlocksAsync(int datasetId, IReadOnlyList<int> cellIds, IReadOnlyList<StatisticBlock> blocks, DateTime computedAtUtc, CancellationToken cancel = default)
    {
        await using var connection = await dataSource.OpenConnectionAsync(cancel);
        await using var transaction = await connection.BeginTransactionAsync(cancel);
        var ids = cellIds.ToArray();
        var replaced = ids.ToHashSet();
        var touched = ids.Select(StatisticBlock.BlockOf).Distinct().Order().ToArray();

        var kept = new List<StatisticRow>();
        foreach (var partial in await BlocksWithOtherCellsAsync(connection, transaction, datasetId, touched, replaced, cancel))
            kept.AddRange(partial.Unpack().Where(r => !replaced.Contains(r.CellId)));
        if (kept.Count > 0) blocks = StatisticBlock.Pack(kept.Concat(blocks.SelectMany(b => b.Unpack())));

        await using (var delete = new NpgsqlCommand("DELETE FROM statistic_block WHERE dataset_id = $1 AND block = ANY($2)", connection, transaction))
        {
            delete.Parameters.AddWithValue(datasetId);
            delete.Parameters.AddWithValue(touched);
            await delete.ExecuteNonQueryAsync(cancel);
        }
        await using (var delete = new NpgsqlCommand("DELETE FROM cell_statistic_state WHERE dataset_id = $1 AND cell_id = ANY($2)", connection, transaction))
        {
            delete.Parameters.AddWithValue(datasetId);
            delete.Parameters.AddWithValue(ids);
            await delete.ExecuteNonQueryAsync(cancel);
        }
        await CopyBlocksAsync(connection, datasetId, blocks, null, cancel);
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

    /// <summary>
    /// Writes packed blocks by binary COPY in the caller's transaction: into <c>statistic_block</c>, or with
    /// <paramref name="passId"/> into the staging table of that pass (<see cref="Passes.PassStore"/>).
    /// </summary>
    public static async Task CopyBlocksAsync(NpgsqlConnection connection, int datasetId, IEnumerable<StatisticBlock> blocks, long? passId, CancellationToken cancel)
    {
        var target = passId is null ? "statistic_block (dataset_id" : "statistic_block_stage (pass_id, dataset_id";
        await using var copy = await connection.BeginRawBinaryCopyAsync($"COPY {target}, {BlockColumns}) FROM STDIN (FORMAT BINARY)", cancel);
        var encoder = new BinaryCopyEncoder(copy);
        encoder.WriteHeader();
        foreach (var block in blocks)
        {
            cancel.ThrowIfCancellationRequested();
            encoder.StartRow((short)(passId is null ? 17 : 18));
            if (passId is { } pass) encoder.WriteInt64(pass);
            encoder.WriteInt32(datasetId);
            encoder.WriteInt16(StatisticCodes.Of(block.Parameter));
            encoder.WriteInt16(block.Period.Code);
            encoder.WriteInt32(block.Block);
            encoder.WriteInt32Array(block.CellIds);
            encoder.WriteInt32Array(block.Count);
            foreach (var column in new[] { block.Coverage, block.Mean, block.Sd, block.Min, block.Max, block.P10, block.P50, block.P90, block.P99 })
                encoder.WriteRealArray(column.AsSpan());
            encoder.WriteInt16((short)block.FractionsWidth);
            encoder.WriteRealArray(block.Fractions);
        }
        encoder.WriteTrailer();
    }

    /// <summary>
    /// The stored blocks among <paramref name="blocks"/> that hold a cell outside <paramref name="replaced"/>, locked for
    /// update. Only their distinct cell-id lists are read first (the rows of a block mostly share one), so replacing
    /// whole blocks reads no statistics back.
    /// </summary>
    private static async Task<IReadOnlyList<StatisticBlock>> BlocksWithOtherCellsAsync(NpgsqlConnection connection, NpgsqlTransaction transaction,
        int datasetId, int[] blocks, HashSet<int> replaced, CancellationToken cancel)
    {
        await using (var lockRows = new NpgsqlCommand(
            "SELECT count(*) FROM (SELECT 1 FROM statistic_block WHERE dataset_id = $1 AND block = ANY($2) FOR UPDATE) locked", connection, transaction))
        {
            lockRows.Parameters.AddWithValue(datasetId);
            lockRows.Parameters.AddWithValue(blocks);
            await lockRows.ExecuteScalarAsync(cancel);
        }
        var partial = new HashSet<int>();
        await using (var command = new NpgsqlCommand(
            "SELECT DISTINCT block, cell_ids FROM statistic_block WHERE dataset_id = $1 AND block = ANY($2)", connection, transaction))
        {
            command.Parameters.AddWithValue(datasetId);
            command.Parameters.AddWithValue(blocks);
            await using var reader = await command.ExecuteReaderAsync(cancel);
            while (await reader.ReadAsync(cancel))
                if (HoldsOther(reader.GetFieldValue<int[]>(1), replaced))
                    partial.Add(reader.GetInt32(0));
        }
        if (partial.Count == 0) return [];
        await using var read = new NpgsqlCommand($"SELECT {BlockColumns} FROM statistic_block WHERE dataset_id = $1 AND block = ANY($2)", connection, transaction);
        read.Parameters.AddWithValue(datasetId);
        read.Parameters.AddWithValue(partial.ToArray());
        return await ReadBlocksAsync(read, cancel);
    }

    private static bool HoldsOther(int[] cellIds, HashSet<int> replaced)
    {
        foreach (int id in cellIds)
            if (!replaced.Contains(id)) return true;
        return false;
    }

    private static async Task<IReadOnlyList<StatisticBlock>> ReadBlocksAsync(NpgsqlCommand command, CancellationToken cancel)
    {
        var blocks = new List<StatisticBlock>();
        await using var reader = await command.ExecuteReaderAsync(cancel);
        while (await reader.ReadAsync(cancel))
        {
            float[] F(int i) => reader.GetFieldValue<float[]>(i);
            blocks.Add(new StatisticBlock(StatisticCodes.Parameter(reader.GetInt16(0)), AtlasPeriod.FromCode(reader.GetInt16(1)), reader.GetInt32(2), reader.GetFieldValue<int[]>(3),
                reader.GetFieldValue<int[]>(4), F(5), F(6), F(7), F(8), F(9), F(10), F(11), F(12), F(13), reader.GetInt16(14),
                reader.IsDBNull(15) ? null : F(15)));
        }
        return blocks;
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

    /// <summary>Every statistic row of one cell (all periods and parameters), by period and parameter.</summary>
    public async Task<IReadOnlyList<StatisticRow>> ForCellAsync(int datasetId, int cellId, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand($"SELECT {BlockColumns} FROM statistic_block WHERE dataset_id = $1 AND block = $2");
        command.Parameters.AddWithValue(datasetId);
        command.Parameters.AddWithValue(StatisticBlock.BlockOf(cellId));
        return (await ReadBlocksAsync(command, cancel))
            .SelectMany(b => b.Unpack().Where(r => r.CellId == cellId))
            .OrderBy(r => r.Period.Code).ThenBy(r => r.Parameter).ToList();
    }

    /// <summary>
    /// One layer: the chosen statistic of a parameter over a period for every wet cell that has it, with positions,
    /// by cell id. Positions come from <paramref name="cellOf"/> when given (the caller's copy of the dataset's
    /// cells; rows of cells it does not know are left out), else from the cell table. <paramref name="fractionIndex"/>
    /// reads element (1-based) of the fractions instead of a column (exceedance). Absent values are left out.
    /// </summary>
    public async Task<IReadOnlyList<LayerValue>> LayerAsync(int datasetId, WaveParameter parameter, AtlasPeriod period, StatisticKind statistic,
        Func<int, CellRecord?>? cellOf, int? fractionIndex = null, CancellationToken cancel = default)
    {
        // Only the two arrays the layer needs leave the database, by binary COPY decoded here (the numbers in the query
        // are integers and the column an enum name, so nothing in it comes from a user as text).
        var column = fractionIndex is not null ? "extra_width, extra" : "0::smallint, " + statistic.ToString().ToLowerInvariant();
        var found = new List<(int CellId, double Value)>(StatisticBlock.CellsPerBlock);
        await using (var connection = await dataSource.OpenConnectionAsync(cancel))
        await using (var copy = await connection.BeginRawBinaryCopyAsync(
            $"COPY (SELECT cell_ids, {column} FROM statistic_block WHERE dataset_id = {datasetId:D} AND parameter = {StatisticCodes.Of(parameter):D} AND period = {period.Code:D} ORDER BY block) TO STDOUT (FORMAT BINARY)", cancel))
        {
            var decoder = new BinaryCopyDecoder(copy);
            await decoder.ReadHeaderAsync(cancel);
            while (await decoder.StartRowAsync(3, cancel))
            {
                var ids = (await decoder.ReadInt32ArrayAsync(cancel))!;
                int width = await decoder.ReadInt16Async(cancel);
                if (statistic == StatisticKind.Count && fractionIndex is null)
                {
                    var counts = await decoder.ReadInt32ArrayAsync(cancel);
                    for (var i = 0; i < ids.Length; i++) found.Add((ids[i], counts![i]));
                    continue;
                }
                if (await decoder.ReadRealArrayAsync(cancel) is not { } values) continue;
                if (fractionIndex is { } k)
                {
                    if (k < 1 || k > width) continue;
                    for (var i = 0; i < ids.Length; i++)
                        if (values[i * width + k - 1] is var v && !float.IsNaN(v)) found.Add((ids[i], v));
                }
                else
                {
                    for (var i = 0; i < ids.Length; i++)
                        if (!float.IsNaN(values[i])) found.Add((ids[i], values[i]));
                }
            }
        }
        var positions = cellOf ?? (await CellPositionsAsync(datasetId, found.Select(f => f.CellId).ToArray(), cancel)).GetValueOrDefault;
        var layer = new List<LayerValue>(found.Count);
        foreach (var (cellId, value) in found)
            if (positions(cellId) is { } c)
                layer.Add(new LayerValue(cellId, c.Longitude, c.Latitude, c.GridI, c.GridJ, c.DepthMetres, value));
        return layer;
    }

    private async Task<Dictionary<int, CellRecord>> CellPositionsAsync(int datasetId, int[] cellIds, CancellationToken cancel) =>
        (await new CellStore(dataSource).ManyAsync(datasetId, cellIds, cancel)).ToDictionary(c => c.CellId);

    /// <summary>The periods that have statistics in a dataset.</summary>
    public async Task<IReadOnlyList<AtlasPeriod>> PeriodsAsync(int datasetId, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand(
            "SELECT DISTINCT period FROM statistic_block WHERE dataset_id = $1 AND parameter = 0 ORDER BY period");
        command.Parameters.AddWithValue(datasetId);
        var periods = new List<AtlasPeriod>();
        await using var reader = await command.ExecuteReaderAsync(cancel);
        while (await reader.ReadAsync(cancel)) periods.Add(AtlasPeriod.FromCode(reader.GetInt16(0)));
        return periods;
    }
}
