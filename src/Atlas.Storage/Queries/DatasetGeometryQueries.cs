using Atlas.Storage.Statistics;
using Npgsql;

namespace Atlas.Storage.Queries;

/// <summary>When a dataset's statistics were last computed, and for how many cells.</summary>
public sealed record StatisticsStamp(DateTime? ComputedAtUtc, int CellCount)
{
    /// <summary>A short token that changes whenever the statistics are recomputed (for cache keys).</summary>
    public string Token => ComputedAtUtc is { } t ? $"{t.Ticks:x}-{CellCount:x}" : "none";
}

/// <summary>How many source files a dataset holds and when the last was loaded: it moves whenever series, time
/// lines or wet cells may have changed (every ingest or replacement writes a source_file row).</summary>
public sealed record SeriesStamp(int FileCount, DateTime? LastLoadedUtc)
{
    /// <summary>A short token that changes whenever a file is loaded or replaced (for cache keys).</summary>
    public string Token => LastLoadedUtc is { } t ? $"{t.Ticks:x}-{FileCount:x}" : "none";
}

/// <summary>
/// The catalogue as a whole: how many datasets there are, the newest dataset id and when any file of any dataset was last
/// loaded. It moves whenever a dataset is added, removed or loaded again (its metadata, such as the gridded dataset a
/// dataset of output points names, is written with its files).
/// </summary>
public sealed record CatalogStamp(int DatasetCount, int LastDatasetId, int FileCount, DateTime? LastLoadedUtc)
{
    /// <summary>A short token that changes whenever the catalogue changes (for cache keys).</summary>
    public string Token => $"{DatasetCount:x}-{LastDatasetId:x}-{FileCount:x}-{LastLoadedUtc?.Ticks ?? 0:x}";
}

/// <summary>A (parameter, period) pair that has statistics rows in a dataset, with the number of cells that have it.</summary>
public readonly record struct LayerCombination(WaveParameter Parameter, AtlasPeriod Period);

/// <summary>Queries about a dataset as a whole: its typical cell spacing, statistics stamp and stored layers.</summary>
public sealed class DatasetGeometryQueries(NpgsqlDataSource dataSource)
{
    /// <summary>
    /// The median great-circle distance from a wet cell to its nearest wet neighbour, metres, over an even sample of
    /// about 400 wet cells (KNN on the GIST index). Null when the dataset has fewer than two wet cells.
    /// </summary>
    public async Task<double?> TypicalSpacingMetresAsync(int datasetId, CancellationToken cancel = default)
    {
        // The sample is the wet cells whose id is a multiple of k = (wet cells / 400): looked up by key from the
        // multiples of k rather than found by reading every cell, and each one's neighbour searched once (the
        // materialised distances keep the planner from searching again for the IS NOT NULL test).
        await using var command = dataSource.CreateCommand("""
            WITH step AS (
                SELECT greatest(1, (SELECT count(*) FROM cell WHERE dataset_id = $1 AND wet) / 400) AS k,
                       (SELECT max(cell_id) FROM cell WHERE dataset_id = $1) AS last),
            sample AS (
                SELECT c.cell_id, c.geom FROM step, generate_series(0, step.last, step.k) AS id
                  JOIN cell c ON c.dataset_id = $1 AND c.cell_id = id
                 WHERE c.wet),
            nearest AS MATERIALIZED (
                SELECT (SELECT ST_Distance(s.geom::geography, o.geom::geography)
                          FROM cell o WHERE o.dataset_id = $1 AND o.wet AND o.cell_id <> s.cell_id
                         ORDER BY o.geom <-> s.geom LIMIT 1) AS d
                  FROM sample s)
            SELECT percentile_cont(0.5) WITHIN GROUP (ORDER BY d) FROM nearest WHERE d IS NOT NULL
            """);
        command.Parameters.AddWithValue(datasetId);
        return await command.ExecuteScalarAsync(cancel) is double d ? d : null;
    }

    /// <summary>The envelope of every cell centre of the grid, wet and dry, or null before any cell is loaded.</summary>
    public async Task<(double West, double South, double East, double North)?> GridExtentAsync(int datasetId, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand("""
            SELECT ST_XMin(e), ST_YMin(e), ST_XMax(e), ST_YMax(e)
              FROM (SELECT ST_Extent(geom)::geometry AS e FROM cell WHERE dataset_id = $1) s WHERE e IS NOT NULL
            """);
        command.Parameters.AddWithValue(datasetId);
        await using var reader = await command.ExecuteReaderAsync(cancel);
        if (!await reader.ReadAsync(cancel)) return null;
        return (reader.GetDouble(0), reader.GetDouble(1), reader.GetDouble(2), reader.GetDouble(3));
    }

    public async Task<StatisticsStamp> StatisticsStampAsync(int datasetId, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand(
            "SELECT max(computed_at), count(*)::int FROM cell_statistic_state WHERE dataset_id = $1");
        command.Parameters.AddWithValue(datasetId);
        await using var reader = await command.ExecuteReaderAsync(cancel);
        await reader.ReadAsync(cancel);
        return new StatisticsStamp(reader.IsDBNull(0) ? null : reader.GetDateTime(0).ToUniversalTime(), reader.GetInt32(1));
    }

    /// <summary>The stamp of the whole catalogue (counts and maxima of the small dataset and source_file tables).</summary>
    public async Task<CatalogStamp> CatalogStampAsync(CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand("""
            SELECT (SELECT count(*)::int FROM dataset), (SELECT coalesce(max(dataset_id), 0) FROM dataset),
                   (SELECT count(*)::int FROM source_file), (SELECT max(loaded_at) FROM source_file)
            """);
        await using var reader = await command.ExecuteReaderAsync(cancel);
        await reader.ReadAsync(cancel);
        return new CatalogStamp(reader.GetInt32(0), reader.GetInt32(1), reader.GetInt32(2), reader.IsDBNull(3) ? null : reader.GetDateTime(3).ToUniversalTime());
    }

    public async Task<SeriesStamp> SeriesStampAsync(int datasetId, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand("SELECT count(*)::int, max(loaded_at) FROM source_file WHERE dataset_id = $1");
        command.Parameters.AddWithValue(datasetId);
        await using var reader = await command.ExecuteReaderAsync(cancel);
        await reader.ReadAsync(cancel);
        return new SeriesStamp(reader.GetInt32(0), reader.IsDBNull(1) ? null : reader.GetDateTime(1).ToUniversalTime());
    }

    /// <summary>
    /// The distinct (parameter, period) pairs that have statistics, found by skipping through the layer index
    /// (one index probe per pair instead of a scan of every row).
    /// </summary>
    public async Task<IReadOnlyList<LayerCombination>> LayerCombinationsAsync(int datasetId, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand("""
            WITH RECURSIVE pairs AS (
                (SELECT parameter, period FROM statistic_block WHERE dataset_id = $1 ORDER BY parameter, period LIMIT 1)
                UNION ALL
                SELECT n.parameter, n.period FROM pairs p, LATERAL (
                    SELECT parameter, period FROM statistic_block
                     WHERE dataset_id = $1 AND (parameter, period) > (p.parameter, p.period)
                     ORDER BY parameter, period LIMIT 1) n)
            SELECT parameter, period FROM pairs
            """);
        command.Parameters.AddWithValue(datasetId);
        var pairs = new List<LayerCombination>();
        await using var reader = await command.ExecuteReaderAsync(cancel);
        while (await reader.ReadAsync(cancel)) pairs.Add(new LayerCombination(StatisticCodes.Parameter(reader.GetInt16(0)), AtlasPeriod.FromCode(reader.GetInt16(1))));
        return pairs;
    }
}
