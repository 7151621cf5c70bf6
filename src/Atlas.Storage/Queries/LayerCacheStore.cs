using Npgsql;

namespace Atlas.Storage.Queries;

/// <summary>A rendered layer download as cached in <c>layer_cache</c>.</summary>
public sealed record CachedLayer(string ETag, string ContentType, byte[] Content);

/// <summary>
/// Rendered layer downloads keyed by what produced them. <see cref="Statistics.StatisticsStore.ReplaceAsync"/> empties
/// a dataset's cache when its statistics change, and callers put the statistics stamp into the key as well, so a
/// render that raced a recomputation is never served under the new stamp.
/// </summary>
public sealed class LayerCacheStore(NpgsqlDataSource dataSource)
{
    public async Task<CachedLayer?> FindAsync(int datasetId, string cacheKey, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand(
            "SELECT etag, content_type, content FROM layer_cache WHERE dataset_id = $1 AND cache_key = $2");
        command.Parameters.AddWithValue(datasetId);
        command.Parameters.AddWithValue(cacheKey);
        await using var reader = await command.ExecuteReaderAsync(cancel);
        if (!await reader.ReadAsync(cancel)) return null;
        return new CachedLayer(reader.GetString(0), reader.GetString(1), reader.GetFieldValue<byte[]>(2));
    }

    /// <summary>The ETag of a cached layer without its content (to answer a conditional request), or null.</summary>
    public async Task<string?> FindETagAsync(int datasetId, string cacheKey, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand("SELECT etag FROM layer_cache WHERE dataset_id = $1 AND cache_key = $2");
        command.Parameters.AddWithValue(datasetId);
        command.Parameters.AddWithValue(cacheKey);
        return await command.ExecuteScalarAsync(cancel) as string;
    }

    /// <summary>Stores a render; a concurrent render of the same key simply replaces it (same inputs, same bytes).</summary>
    public async Task PutAsync(int datasetId, string cacheKey, CachedLayer layer, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand("""
            INSERT INTO layer_cache (dataset_id, cache_key, etag, content_type, content) VALUES ($1, $2, $3, $4, $5)
            ON CONFLICT (dataset_id, cache_key) DO UPDATE
               SET etag = excluded.etag, content_type = excluded.content_type, content = excluded.content, created_at = now()
            """);
        command.Parameters.AddWithValue(datasetId);
        command.Parameters.AddWithValue(cacheKey);
        command.Parameters.AddWithValue(layer.ETag);
        command.Parameters.AddWithValue(layer.ContentType);
        command.Parameters.AddWithValue(layer.Content);
        await command.ExecuteNonQueryAsync(cancel);
    }
}
