using Npgsql;
using NpgsqlTypes;

namespace Atlas.Storage.Queries;

/// <summary>
/// Site-screening criteria; a null bound is not applied. A cell whose depth (or coast distance) is unknown fails a
/// depth (or coast-distance) criterion, since it cannot be shown to meet it.
/// </summary>
public sealed record ScreeningCriteria(
    short PowerParameter,
    short HsParameter,
    short Period,
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
        await using var command = dataSource.CreateCommand("""
            SELECT c.cell_id, ST_X(c.geom), ST_Y(c.geom), c.depth_m, c.coast_distance_m, j.mean::float8, h.p90::float8
              FROM cell c
              JOIN cell_statistic j ON j.dataset_id = c.dataset_id AND j.cell_id = c.cell_id AND j.period = $2 AND j.parameter = $3
              LEFT JOIN cell_statistic h ON h.dataset_id = c.dataset_id AND h.cell_id = c.cell_id AND h.period = $2 AND h.parameter = $4
             WHERE c.dataset_id = $1 AND c.wet AND j.mean IS NOT NULL
               AND ($5::float8 IS NULL OR j.mean >= $5)
               AND ($6::float8 IS NULL OR c.depth_m >= $6)
               AND ($7::float8 IS NULL OR c.depth_m <= $7)
               AND ($8::float8 IS NULL OR c.coast_distance_m <= $8)
               AND ($9::float8 IS NULL OR h.p90 <= $9)
             ORDER BY c.cell_id
            """);
        command.Parameters.AddWithValue(datasetId);
        command.Parameters.AddWithValue(criteria.Period);
        command.Parameters.AddWithValue(criteria.PowerParameter);
        command.Parameters.AddWithValue(criteria.HsParameter);
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
