using Atlas.Hindcast.Geodesy;
using Atlas.Storage.Cells;
using Atlas.TestSupport;
using Npgsql;

namespace Atlas.Storage.Tests;

/// <summary>The in-memory nearest-cell search and its ellipsoidal distance, checked against PostGIS.</summary>
public sealed class WetCellIndexTests(TestDatabase database) : IClassFixture<TestDatabase>
{
    private static readonly (double Lat, double Lon)[] Pairs =
    [
        (50.1, -26.4), (50.1003, -26.3991),  // 70 m apart
        (49.3, -28.0), (50.7, -25.3),        // across a regional grid
        (0.0, 0.0), (0.0, 1.0),              // along the equator, where Vincenty's cos^2(alpha) is 0
        (-33.9, 151.2), (-33.95, 151.3),
        (60.0, 179.95), (60.05, -179.95),    // across the antimeridian
        (89.9, 10.0), (89.9, -170.0),        // across the pole
    ];

    [Fact]
    public async Task VincentyDistanceEqualsPostgisGeographyDistanceToAMillimetre()
    {
        // Reference: PostGIS ST_Distance(geography, geography) on the WGS 84 spheroid (use_spheroid defaults to true).
        await using var connection = await database.DataSource.OpenConnectionAsync();
        for (var k = 0; k < Pairs.Length; k += 2)
        {
            var (a, b) = (Pairs[k], Pairs[k + 1]);
            await using var command = new NpgsqlCommand(
                "SELECT ST_Distance(ST_SetSRID(ST_MakePoint($2, $1), 4326)::geography, ST_SetSRID(ST_MakePoint($4, $3), 4326)::geography)", connection);
            foreach (var v in new[] { a.Lat, a.Lon, b.Lat, b.Lon }) command.Parameters.AddWithValue(v);
            var postgis = (double)(await command.ExecuteScalarAsync())!;
            Assert.Equal(postgis, GeodesicDistance.Metres(a.Lat, a.Lon, b.Lat, b.Lon), 1e-3);
        }
    }

    [Fact]
    public async Task NearestWetCellIsTheOneWithTheSmallestPostgisDistance()
    {
        // Reference: a brute-force ORDER BY ST_Distance(geography) over the same cells in PostGIS.
        var random = new Random(20261202);
        var cells = new List<CellRecord>();
        for (var id = 0; id < 3000; id++)
        {
            // A ragged regional grid with land holes, and a few cells across the antimeridian.
            var lat = 49 + random.NextDouble() * 2;
            var lon = id < 2900 ? -28 + random.NextDouble() * 3 : (random.NextDouble() < 0.5 ? 179.9 : -179.9) + random.NextDouble() * 0.05 - 0.025;
            cells.Add(new CellRecord(id, null, null, lon, lat, 50, Wet: random.NextDouble() > 0.2));
        }
        var index = new WetCellIndex(cells);
        Assert.Equal(cells.Count(c => c.Wet), index.Count);

        await using var connection = await database.DataSource.OpenConnectionAsync();
        await using (var create = new NpgsqlCommand("CREATE TEMP TABLE probe_cell (cell_id int, geom geography, wet boolean)", connection))
            await create.ExecuteNonQueryAsync();
        await using (var copy = await connection.BeginTextImportAsync("COPY probe_cell FROM STDIN"))
            foreach (var c in cells)
                await copy.WriteLineAsync(FormattableString.Invariant($"{c.CellId}\tSRID=4326;POINT({c.Longitude:R} {c.Latitude:R})\t{c.Wet}"));

        for (var probe = 0; probe < 60; probe++)
        {
            var lat = 49 + random.NextDouble() * 2;
            var lon = probe < 55 ? -28 + random.NextDouble() * 3 : 179.95 + random.NextDouble() * 0.1 - (random.NextDouble() < 0.5 ? 0 : 360);
            var nearest = index.Nearest(lat, lon)!;
            await using var query = new NpgsqlCommand("""
                SELECT cell_id, ST_Distance(geom, ST_SetSRID(ST_MakePoint($2, $1), 4326)::geography) AS d
                  FROM probe_cell WHERE wet ORDER BY d, cell_id LIMIT 1
                """, connection);
            query.Parameters.AddWithValue(lat);
            query.Parameters.AddWithValue(lon);
            await using var reader = await query.ExecuteReaderAsync();
            await reader.ReadAsync();
            Assert.Equal(reader.GetInt32(0), nearest.Cell.CellId);
            Assert.Equal(reader.GetDouble(1), nearest.DistanceMetres, 1e-3);
        }
    }

    [Fact]
    public void AnIndexWithoutWetCellsFindsNothing()
    {
        var index = new WetCellIndex([new CellRecord(1, 0, 0, 10, 50, null, Wet: false)]);
        Assert.Equal(0, index.Count);
        Assert.Null(index.Nearest(50, 10));
    }
}
