using NetTopologySuite.Geometries;
using Npgsql;
using NpgsqlTypes;

namespace Atlas.Storage.Queries;

/// <summary>Geodesic facts about an area a client sends, computed by PostGIS on the WGS 84 spheroid.</summary>
public sealed class AreaQueries(NpgsqlDataSource dataSource)
{
    /// <summary>The area of a (valid, EPSG:4326) polygon or multipolygon on the spheroid, m2.</summary>
    public async Task<double> SpheroidAreaSquareMetresAsync(Geometry area, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand("SELECT ST_Area(ST_SetSRID($1::geometry, 4326)::geography, true)");
        command.Parameters.AddWithValue(NpgsqlDbType.Geometry, area);
        return (double)(await command.ExecuteScalarAsync(cancel))!;
    }
}
