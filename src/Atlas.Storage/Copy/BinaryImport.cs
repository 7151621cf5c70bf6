using Npgsql;
using NpgsqlTypes;

namespace Atlas.Storage.Copy;

/// <summary>Bulk writes through Npgsql's typed binary COPY importer, the frame every store's COPY shares.</summary>
internal static class BinaryImport
{
    /// <summary>
    /// Writes one row a value with binary COPY on the caller's connection (inside its transaction, if any):
    /// <paramref name="writeFields"/> writes a row's fields in the column order of <paramref name="copyCommand"/>.
    /// Nothing is written unless every row is (COPY is one statement).
    /// </summary>
    public static async Task WriteRowsAsync<T>(NpgsqlConnection connection, string copyCommand, IEnumerable<T> rows,
        Func<NpgsqlBinaryImporter, T, CancellationToken, Task> writeFields, CancellationToken cancel)
    {
        await using var writer = await connection.BeginBinaryImportAsync(copyCommand, cancel);
        foreach (var row in rows)
        {
            await writer.StartRowAsync(cancel);
            await writeFields(writer, row, cancel);
        }
        await writer.CompleteAsync(cancel);
    }

    /// <summary>Writes the value, or NULL when there is none.</summary>
    public static async Task WriteOrNullAsync<T>(this NpgsqlBinaryImporter writer, T? value, NpgsqlDbType type, CancellationToken cancel)
        where T : struct
    {
        if (value is { } v) await writer.WriteAsync(v, type, cancel);
        else await writer.WriteNullAsync(cancel);
    }
}
