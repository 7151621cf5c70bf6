using Atlas.TestSupport;

namespace Atlas.Ingest.Tests;

/// <summary>What a dataset holds, to show that a refused ingest changed nothing: row counts and a digest of every payload.</summary>
public static class IngestCounts
{
    public static async Task<(long Chunks, long Cells, long Files, string Payloads)> OfAsync(TestDatabase database, string slug)
    {
        await using var command = database.DataSource.CreateCommand("""
            SELECT (SELECT count(*) FROM series_chunk k WHERE k.dataset_id = d.dataset_id),
                   (SELECT count(*) FROM cell c WHERE c.dataset_id = d.dataset_id),
                   (SELECT count(*) FROM source_file f WHERE f.dataset_id = d.dataset_id),
                   (SELECT md5(string_agg(md5(payload), '' ORDER BY cell_id, year)) FROM series_chunk k WHERE k.dataset_id = d.dataset_id)
              FROM dataset d WHERE slug = $1
            """);
        command.Parameters.AddWithValue(slug);
        await using var reader = await command.ExecuteReaderAsync();
        await reader.ReadAsync();
        return (reader.GetInt64(0), reader.GetInt64(1), reader.GetInt64(2), reader.GetString(3));
    }
}
