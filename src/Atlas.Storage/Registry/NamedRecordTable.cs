using Npgsql;

namespace Atlas.Storage.Registry;

/// <summary>
/// The reading queries of a table of named records loaded from files (stations, device matrices): every row has an
/// integer id, a unique URL name (slug), a unique name and the SHA-256 of the file it came from.
/// </summary>
/// <param name="table">The table, e.g. <c>station</c>.</param>
/// <param name="idColumn">Its integer key column, e.g. <c>station_id</c>.</param>
/// <param name="columns">The select list <paramref name="read"/> expects, in its order.</param>
/// <param name="read">Builds a record from the current row of a reader over <paramref name="columns"/>.</param>
internal sealed class NamedRecordTable<T>(
    NpgsqlDataSource dataSource, string table, string idColumn, string columns, Func<NpgsqlDataReader, T> read)
    where T : class
{
    /// <summary>Every record, by name.</summary>
    public async Task<IReadOnlyList<T>> ListAsync(CancellationToken cancel)
    {
        await using var command = dataSource.CreateCommand($"SELECT {columns} FROM {table} ORDER BY name");
        return await ReadAllAsync(command, cancel);
    }

    /// <summary>The record with this slug or name (names compared case-insensitively; a slug match wins), or null.</summary>
    public async Task<T?> FindAsync(string nameOrSlug, CancellationToken cancel)
    {
        await using var command = dataSource.CreateCommand(
            $"SELECT {columns} FROM {table} WHERE slug = $1 OR lower(name) = lower($1) ORDER BY slug = $1 DESC LIMIT 1");
        command.Parameters.AddWithValue(nameOrSlug);
        var rows = await ReadAllAsync(command, cancel);
        return rows.Count == 0 ? null : rows[0];
    }

    /// <summary>The records read from a file with this SHA-256 (any case), by name.</summary>
    public async Task<IReadOnlyList<T>> FindBySha256Async(string sha256, CancellationToken cancel)
    {
        await using var command = dataSource.CreateCommand($"SELECT {columns} FROM {table} WHERE source_sha256 = $1 ORDER BY name");
        command.Parameters.AddWithValue(sha256.ToLowerInvariant());
        return await ReadAllAsync(command, cancel);
    }

    /// <summary>Removes the record with this slug or name (and, through the schema's cascades, what hangs off it); false when there is none.</summary>
    public async Task<bool> DeleteAsync(string nameOrSlug, Func<T, int> idOf, CancellationToken cancel)
    {
        if (await FindAsync(nameOrSlug, cancel) is not { } record) return false;
        await using var command = dataSource.CreateCommand($"DELETE FROM {table} WHERE {idColumn} = $1");
        command.Parameters.AddWithValue(idOf(record));
        return await command.ExecuteNonQueryAsync(cancel) > 0;
    }

    private async Task<IReadOnlyList<T>> ReadAllAsync(NpgsqlCommand command, CancellationToken cancel)
    {
        var rows = new List<T>();
        await using var reader = await command.ExecuteReaderAsync(cancel);
        while (await reader.ReadAsync(cancel))
            rows.Add(read(reader));
        return rows;
    }
}
