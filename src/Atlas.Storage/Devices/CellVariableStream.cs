using System.Text;
using Atlas.Storage.Series;
using Npgsql;
using NpgsqlTypes;

namespace Atlas.Storage.Devices;

/// <summary>
/// One cell-year with only the variables asked for: each as a payload in the <see cref="SeriesCodec"/> layout that holds
/// that variable alone (decode it with <see cref="SeriesCodec.Decode"/>), or null where the chunk lacks it.
/// </summary>
public sealed record CellVariableChunk(int CellId, int Year, byte[]?[] Payloads);

/// <summary>
/// Streams selected variables of every cell of a dataset for whole-dataset layers (device yield, accessibility). Chunks
/// are stored uncompressed out of line (STORAGE EXTERNAL), so PostgreSQL reads just the byte range of each variable:
/// two variables of five cost two fifths of a full read.
/// </summary>
public sealed class CellVariableStream(NpgsqlDataSource dataSource)
{
    /// <summary>The chunks ordered by cell, then year.</summary>
    public async IAsyncEnumerable<CellVariableChunk> StreamAsync(int datasetId, IReadOnlyList<WaveParameter> variables,
        [System.Runtime.CompilerServices.EnumeratorCancellation] CancellationToken cancel = default)
    {
        if (variables.Count == 0) throw new ArgumentException("Ask for at least one variable.", nameof(variables));
        var slices = new StringBuilder();
        foreach (var variable in variables)
        {
            var bit = SeriesCodec.BitOf(variable);
            // Offset of the variable: the 6-byte header, then one run of 2 * step_count bytes per present variable before it.
            var before = string.Join(" + ", Enumerable.Range(0, SeriesCodec.SlotOf(variable)).Select(u => $"((mask >> {u}) & 1)").DefaultIfEmpty("0"));
            slices.Append($", CASE WHEN mask & {bit} = 0 THEN NULL ELSE substring(payload FROM {SeriesCodec.HeaderBytes + 1} + 2 * step_count * ({before}) FOR 2 * step_count) END");
        }
        var sql = $"""
            COPY (SELECT cell_id, year, step_count{slices}
                    FROM (SELECT cell_id, year, step_count, get_byte(substring(payload FROM 1 FOR {SeriesCodec.HeaderBytes}), 1) AS mask, payload
                            FROM series_chunk WHERE dataset_id = {datasetId:D}) c
                   ORDER BY cell_id, year) TO STDOUT (FORMAT BINARY)
            """;
        await using var connection = await dataSource.OpenConnectionAsync(cancel);
        await using var reader = await connection.BeginBinaryExportAsync(sql, cancel);
        while (await reader.StartRowAsync(cancel) != -1)
        {
            var cell = await reader.ReadAsync<int>(NpgsqlDbType.Integer, cancel);
            var year = await reader.ReadAsync<short>(NpgsqlDbType.Smallint, cancel);
            var steps = await reader.ReadAsync<int>(NpgsqlDbType.Integer, cancel);
            var payloads = new byte[]?[variables.Count];
            for (var k = 0; k < variables.Count; k++)
            {
                if (reader.IsNull)
                {
                    await reader.SkipAsync(cancel);
                    continue;
                }
                var values = await reader.ReadAsync<byte[]>(NpgsqlDbType.Bytea, cancel);
                var payload = SeriesCodec.CreateEmpty(steps, SeriesCodec.BitOf(variables[k]));
                values.CopyTo(payload, SeriesCodec.HeaderBytes);
                payloads[k] = payload;
            }
            yield return new CellVariableChunk(cell, year, payloads);
        }
    }
}
