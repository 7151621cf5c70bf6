using Atlas.Storage.Copy;
using Npgsql;
using NpgsqlTypes;

namespace Atlas.Storage.Series;

/// <summary>Cell-major series chunks (one row per cell and year).</summary>
public sealed class SeriesStore(NpgsqlDataSource dataSource)
{
    /// <summary>Bulk-writes chunks with binary COPY inside the caller's transaction (the rows must not exist yet).</summary>
    public static Task WriteAsync(NpgsqlConnection connection, int datasetId, IEnumerable<SeriesChunk> chunks, CancellationToken cancel) =>
        WriteAsync(connection, datasetId, chunks.Select(c => new StreamedSeriesChunk(c.CellId, c.Year, c.Payload)), cancel);

    /// <summary>
    /// Writes chunks whose payloads are views of the caller's buffers (the ingest reuses one buffer per block of cells):
    /// the buffers must stay untouched until the returned task completes.
    /// </summary>
    public static async Task WriteAsync(NpgsqlConnection connection, int datasetId, IEnumerable<StreamedSeriesChunk> chunks, CancellationToken cancel)
    {
        await BinaryImport.WriteRowsAsync(connection,
            "COPY series_chunk (dataset_id, cell_id, year, step_count, payload) FROM STDIN (FORMAT BINARY)", chunks,
            async (writer, chunk, cancel) =>
            {
                await writer.WriteAsync(datasetId, NpgsqlDbType.Integer, cancel);
                await writer.WriteAsync(chunk.CellId, NpgsqlDbType.Integer, cancel);
                await writer.WriteAsync((short)chunk.Year, NpgsqlDbType.Smallint, cancel);
                await writer.WriteAsync(SeriesCodec.StepCountOf(chunk.Payload.Span), NpgsqlDbType.Integer, cancel);
                await writer.WriteAsync(chunk.Payload, NpgsqlDbType.Bytea, cancel);
            }, cancel);
    }

    /// <summary>The cells that have at least one chunk in the dataset, ascending.</summary>
    public static async Task<int[]> CellsWithSeriesAsync(NpgsqlConnection connection, NpgsqlTransaction transaction, int datasetId, CancellationToken cancel)
    {
        await using var command = new NpgsqlCommand("SELECT DISTINCT cell_id FROM series_chunk WHERE dataset_id = $1 ORDER BY cell_id", connection, transaction);
        command.Parameters.AddWithValue(datasetId);
        var ids = new List<int>();
        await using var reader = await command.ExecuteReaderAsync(cancel);
        while (await reader.ReadAsync(cancel)) ids.Add(reader.GetInt32(0));
        return ids.ToArray();
    }

    /// <summary>Deletes the chunks of the given years for cells in [firstCell, lastCell].</summary>
    public static async Task DeleteAsync(NpgsqlConnection connection, NpgsqlTransaction transaction, int datasetId, int year,
        int firstCell, int lastCell, CancellationToken cancel)
    {
        await using var command = YearOfCellsCommand("DELETE", connection, transaction, datasetId, year, firstCell, lastCell);
        await command.ExecuteNonQueryAsync(cancel);
    }

    /// <summary>The chunks of one year for cells in [firstCell, lastCell], by cell id.</summary>
    public static async Task<Dictionary<int, byte[]>> ReadYearAsync(NpgsqlConnection connection, NpgsqlTransaction? transaction, int datasetId, int year,
        int firstCell, int lastCell, CancellationToken cancel)
    {
        await using var command = YearOfCellsCommand("SELECT cell_id, payload", connection, transaction, datasetId, year, firstCell, lastCell);
        var result = new Dictionary<int, byte[]>();
        await using var reader = await command.ExecuteReaderAsync(cancel);
        while (await reader.ReadAsync(cancel)) result[reader.GetInt32(0)] = reader.GetFieldValue<byte[]>(1);
        return result;
    }

    /// <summary>A statement over the chunks of one year for cells in [firstCell, lastCell]: <paramref name="action"/> is what comes before FROM.</summary>
    private static NpgsqlCommand YearOfCellsCommand(string action, NpgsqlConnection connection, NpgsqlTransaction? transaction,
        int datasetId, int year, int firstCell, int lastCell)
    {
        var command = new NpgsqlCommand(
            $"{action} FROM series_chunk WHERE dataset_id = $1 AND year = $2 AND cell_id BETWEEN $3 AND $4", connection, transaction);
        command.Parameters.AddWithValue(datasetId);
        command.Parameters.AddWithValue((short)year);
        command.Parameters.AddWithValue(firstCell);
        command.Parameters.AddWithValue(lastCell);
        return command;
    }

    /// <summary>Every chunk of one cell, by year (optionally limited to a year range).</summary>
    public async Task<IReadOnlyList<SeriesChunk>> ReadCellAsync(int datasetId, int cellId, int? fromYear = null, int? toYear = null, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand("""
            SELECT year, payload FROM series_chunk
             WHERE dataset_id = $1 AND cell_id = $2 AND year BETWEEN $3 AND $4 ORDER BY year
            """);
        command.Parameters.AddWithValue(datasetId);
        command.Parameters.AddWithValue(cellId);
        command.Parameters.AddWithValue((short)(fromYear ?? short.MinValue));
        command.Parameters.AddWithValue((short)(toYear ?? short.MaxValue));
        var chunks = new List<SeriesChunk>();
        await using var reader = await command.ExecuteReaderAsync(cancel);
        while (await reader.ReadAsync(cancel)) chunks.Add(new SeriesChunk(cellId, reader.GetInt16(0), reader.GetFieldValue<byte[]>(1)));
        return chunks;
    }

    /// <summary>
    /// Streams every chunk of the given cells, ordered by cell then year, through binary COPY (the fastest way out of
    /// PostgreSQL). <paramref name="onlyCells"/> limits it to a set of cells when given. Each chunk's payload is a view
    /// of a reused buffer, valid until the enumeration moves on: decode it before asking for the next chunk.
    /// </summary>
    public async IAsyncEnumerable<StreamedSeriesChunk> StreamAsync(int datasetId, int[]? onlyCells = null,
        [System.Runtime.CompilerServices.EnumeratorCancellation] CancellationToken cancel = default)
    {
        await using var connection = await dataSource.OpenConnectionAsync(cancel);
        var filter = onlyCells is null ? "" : $" AND cell_id = ANY('{{{string.Join(',', onlyCells)}}}'::int[])";
        await using var copy = await connection.BeginRawBinaryCopyAsync(
            $"COPY (SELECT cell_id, year, payload FROM series_chunk WHERE dataset_id = {datasetId:D}{filter} ORDER BY cell_id, year) TO STDOUT (FORMAT BINARY)", cancel);
        var decoder = new Copy.BinaryCopyDecoder(copy);
        await decoder.ReadHeaderAsync(cancel);
        while (await decoder.StartRowAsync(3, cancel))
        {
            var cell = await decoder.ReadInt32Async(cancel);
            var year = await decoder.ReadInt16Async(cancel);
            yield return new StreamedSeriesChunk(cell, year, await decoder.ReadBytesAsync(cancel));
        }
    }

    /// <summary>Bytes on disk of the chunk table (heap, TOAST and indexes), for storage reports.</summary>
    public async Task<(long Bytes, long Values)> StorageAsync(int datasetId, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand("""
            SELECT pg_total_relation_size('series_chunk'),
                   (SELECT coalesce(sum((length(payload) - 6) / 2), 0) FROM series_chunk WHERE dataset_id = $1)::bigint
            """);
        command.Parameters.AddWithValue(datasetId);
        await using var reader = await command.ExecuteReaderAsync(cancel);
        await reader.ReadAsync(cancel);
        return (reader.GetInt64(0), reader.GetInt64(1));
    }
}
