using Atlas.Storage.Statistics;
using Npgsql;
using NpgsqlTypes;

namespace Atlas.Storage.Queries;

/// <summary>
/// Site-screening criteria; a null bound is not applied. A cell whose depth (or coast distance) is unknown fails a
/// depth (or coast-distance) criterion, since it cannot be shown to meet it. Power is the period's mean J, the Hs
/// bound applies to its p90.
/// </summary>
public sealed record ScreeningCriteria(
    AtlasPeriod Period,
    double? MinimumMeanPowerKilowattsPerMetre,
    double? MinimumDepthMetres,
    double? MaximumDepthMetres,
    double? MaximumCoastDistanceMetres,
    double? MaximumHsP90Metres);

/// <summary>A wet cell that meets every screening criterion.</summary>
public sealed record ScreenedCell(int CellId, double Longitude, double Latitude, float? DepthMetres, float? CoastDistanceMetres,
    double MeanPowerKilowattsPerMetre, double? HsP90Metres);

/// <summary>Selects the wet cells of a dataset that meet site-screening criteria, from the stored statistics.</summary>
public sealed class ScreeningQueries(NpgsqlDataSource dataSource)
{
    public async Task<IReadOnlyList<ScreenedCell>> MatchingCellsAsync(int datasetId, ScreeningCriteria criteria, CancellationToken cancel = default)
    {
        // The two statistics are unpacked straight from their blocks (only the arrays needed); absent values are NaN
        // there, which PostgreSQL orders above every number, so they become NULL before any comparison.
        await using var command = dataSource.CreateCommand("""
            WITH j AS (SELECT u.cell_id, nullif(u.mean, 'NaN') AS mean
                         FROM statistic_block b CROSS JOIN LATERAL unnest(b.cell_ids, b.mean) u(cell_id, mean)
                        WHERE b.dataset_id = $1 AND b.period = $2 AND b.parameter = $3),
                 h AS (SELECT u.cell_id, nullif(u.p90, 'NaN') AS p90
                         FROM statistic_block b CROSS JOIN LATERAL unnest(b.cell_ids, b.p90) u(cell_id, p90)
                        WHERE b.dataset_id = $1 AND b.period = $2 AND b.parameter = $4)
            SELECT c.cell_id, ST_X(c.geom), ST_Y(c.geom), c.depth_m, c.coast_distance_m, j.mean::float8, h.p90::float8
              FROM cell c
              JOIN j ON j.cell_id = c.cell_id
              LEFT JOIN h ON h.cell_id = c.cell_id
             WHERE c.dataset_id = $1 AND c.wet AND j.mean IS NOT NULL
               AND ($5::float8 IS NULL OR j.mean >= $5)
               AND ($6::float8 IS NULL OR c.depth_m >= $6)
               AND ($7::float8 IS NULL OR c.depth_m <= $7)
               AND ($8::float8 IS NULL OR c.coast_distance_m <= $8)
               AND ($9::float8 IS NULL OR h.p90 <= $9)
             ORDER BY c.cell_id
            """);
        command.Parameters.AddWithValue(datasetId);
        command.Parameters.AddWithValue(criteria.Period.Code);
        command.Parameters.AddWithValue(StatisticCodes.Of(WaveParameter.J));
        command.Parameters.AddWithValue(StatisticCodes.Of(WaveParameter.Hs));
        foreach (var bound in new[] { criteria.MinimumMeanPowerKilowattsPerMetre, criteria.MinimumDepthMetres, criteria.MaximumDepthMetres,
                     criteria.MaximumCoastDistanceMetres, criteria.MaximumHsP90Metres })
            command.Parameters.AddWithValue(NpgsqlDbType.Double, (object?)bound ?? DBNull.Value);
        var cells = new List<ScreenedCell>();
        await using var reader = await command.ExecuteReaderAsync(cancel);
        while (await reader.ReadAsync(cancel))
            cells.Add(new ScreenedCell(reader.GetInt32(0), reader.GetDouble(1), reader.GetDouble(2),
                reader.IsDBNull(3) ? null : reader.GetFloat(3), reader.IsDBNull(4) ? null : reader.GetFloat(4),
                reader.GetDouble(5), reader.IsDBNull(6) ? null : reader.GetDouble(6)));
        return cells;
    }
}
