using Npgsql;

namespace Atlas.TestSupport;

/// <summary>What a dataset's statistics are stored as, for tests that compare two passes block for block.</summary>
public static class StoredStatistics
{
    /// <summary>Every stored statistic block of a dataset, all columns as text, in key order.</summary>
    public static async Task<List<string>> BlocksAsync(NpgsqlDataSource dataSource, string slug)
    {
        await using var command = dataSource.CreateCommand("""
            SELECT concat_ws('|', parameter, period, block, cell_ids, count, coverage, mean, sd, min, max, p10, p50, p90, p99, extra_width, extra)
              FROM statistic_block b JOIN dataset d USING (dataset_id) WHERE d.slug = $1 ORDER BY parameter, period, block
            """);
        command.Parameters.AddWithValue(slug);
        var rows = new List<string>();
        await using var reader = await command.ExecuteReaderAsync();
        while (await reader.ReadAsync()) rows.Add(reader.GetString(0));
        return rows;
    }
}
