using Atlas.Storage.Copy;
using NetTopologySuite.Geometries;
using Npgsql;
using NpgsqlTypes;

namespace Atlas.Storage.Cells;

/// <summary>Cells (grid points) of datasets and the mesh triangles between them.</summary>
public sealed class CellStore(NpgsqlDataSource dataSource)
{
    private static readonly GeometryFactory Wgs84 = new(new PrecisionModel(), 4326);

    /// <summary>Bulk-loads cells with binary COPY inside the caller's transaction.</summary>
    public static async Task InsertAsync(NpgsqlConnection connection, int datasetId, IEnumerable<CellRecord> cells, CancellationToken cancel)
    {
        await BinaryImport.WriteRowsAsync(connection,
            "COPY cell (dataset_id, cell_id, grid_i, grid_j, geom, depth_m, wet, coast_distance_m) FROM STDIN (FORMAT BINARY)", cells,
            async (writer, cell, cancel) =>
            {
                await writer.WriteAsync(datasetId, NpgsqlDbType.Integer, cancel);
                await writer.WriteAsync(cell.CellId, NpgsqlDbType.Integer, cancel);
                await writer.WriteOrNullAsync(cell.GridI, NpgsqlDbType.Integer, cancel);
                await writer.WriteOrNullAsync(cell.GridJ, NpgsqlDbType.Integer, cancel);
                await writer.WriteAsync((Geometry)Wgs84.CreatePoint(new Coordinate(cell.Longitude, cell.Latitude)), NpgsqlDbType.Geometry, cancel);
                await writer.WriteOrNullAsync(cell.DepthMetres, NpgsqlDbType.Real, cancel);
                await writer.WriteAsync(cell.Wet, NpgsqlDbType.Boolean, cancel);
                await writer.WriteOrNullAsync(cell.CoastDistanceMetres, NpgsqlDbType.Real, cancel);
            }, cancel);
    }

    public static async Task InsertTrianglesAsync(NpgsqlConnection connection, int datasetId, IReadOnlyList<(int A, int B, int C)> triangles, CancellationToken cancel)
    {
        await BinaryImport.WriteRowsAsync(connection,
            "COPY mesh_triangle (dataset_id, triangle_id, node_a, node_b, node_c) FROM STDIN (FORMAT BINARY)", Enumerable.Range(0, triangles.Count),
            async (writer, i, cancel) =>
            {
                await writer.WriteAsync(datasetId, NpgsqlDbType.Integer, cancel);
                await writer.WriteAsync(i, NpgsqlDbType.Integer, cancel);
                await writer.WriteAsync(triangles[i].A, NpgsqlDbType.Integer, cancel);
                await writer.WriteAsync(triangles[i].B, NpgsqlDbType.Integer, cancel);
                await writer.WriteAsync(triangles[i].C, NpgsqlDbType.Integer, cancel);
            }, cancel);
    }

    /// <summary>
    /// Computes each wet cell's distance to the nearest dry cell (a coast proxy from the dataset's own land mask), in
    /// metres on the spheroid. Leaves NULL where the dataset has no dry cell.
    /// </summary>
    /// <summary>Marks cells wet (a later file holds data where the earlier ones had none); nothing for an empty list.</summary>
    public static async Task MarkWetAsync(NpgsqlConnection connection, NpgsqlTransaction transaction, int datasetId, int[] cellIds, CancellationToken cancel)
    {
        if (cellIds.Length == 0) return;
        await using var command = new NpgsqlCommand("UPDATE cell SET wet = true WHERE dataset_id = $1 AND cell_id = ANY($2)", connection, transaction);
        command.Parameters.AddWithValue(datasetId);
        command.Parameters.AddWithValue(cellIds);
        await command.ExecuteNonQueryAsync(cancel);
    }

    public static async Task UpdateCoastDistanceAsync(NpgsqlConnection connection, NpgsqlTransaction transaction, int datasetId, CancellationToken cancel)
    {
        await using var command = new NpgsqlCommand("""
            UPDATE cell c SET coast_distance_m = (
                SELECT ST_Distance(c.geom::geography, d.geom::geography)
                  FROM cell d WHERE d.dataset_id = c.dataset_id AND NOT d.wet
                 ORDER BY d.geom <-> c.geom LIMIT 1)
             WHERE c.dataset_id = $1 AND c.wet
               AND EXISTS (SELECT 1 FROM cell d WHERE d.dataset_id = $1 AND NOT d.wet)
            """, connection, transaction);
        command.Parameters.AddWithValue(datasetId);
        await command.ExecuteNonQueryAsync(cancel);
    }

    /// <summary>The nearest wet cell to a position (KNN on the GIST index), or null when the dataset has none.</summary>
    public async Task<NearestCell?> NearestWetAsync(int datasetId, double latitude, double longitude, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand("""
            SELECT cell_id, grid_i, grid_j, ST_X(geom), ST_Y(geom), depth_m, wet, coast_distance_m,
                   ST_Distance(geom::geography, ST_SetSRID(ST_MakePoint($3, $2), 4326)::geography)
              FROM cell WHERE dataset_id = $1 AND wet
             ORDER BY geom <-> ST_SetSRID(ST_MakePoint($3, $2), 4326) LIMIT 1
            """);
        command.Parameters.AddWithValue(datasetId);
        command.Parameters.AddWithValue(latitude);
        command.Parameters.AddWithValue(longitude);
        await using var reader = await command.ExecuteReaderAsync(cancel);
        if (!await reader.ReadAsync(cancel)) return null;
        return new NearestCell(Read(reader), reader.GetDouble(8));
    }

    /// <summary>The number of wet cells of a dataset.</summary>
    public async Task<int> WetCountAsync(int datasetId, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand("SELECT count(*)::int FROM cell WHERE dataset_id = $1 AND wet");
        command.Parameters.AddWithValue(datasetId);
        return (int)(await command.ExecuteScalarAsync(cancel))!;
    }

    public async Task<CellRecord?> FindAsync(int datasetId, int cellId, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand($"SELECT {Columns} FROM cell WHERE dataset_id = $1 AND cell_id = $2");
        command.Parameters.AddWithValue(datasetId);
        command.Parameters.AddWithValue(cellId);
        await using var reader = await command.ExecuteReaderAsync(cancel);
        return await reader.ReadAsync(cancel) ? Read(reader) : null;
    }

    /// <summary>Every cell of a dataset (wet and dry), by cell id.</summary>
    public async Task<IReadOnlyList<CellRecord>> AllAsync(int datasetId, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand($"SELECT {Columns} FROM cell WHERE dataset_id = $1 ORDER BY cell_id");
        command.Parameters.AddWithValue(datasetId);
        return await ReadCellsAsync(command, cancel);
    }

    /// <summary>The cells of a dataset with the given ids (those that exist), by cell id.</summary>
    public async Task<IReadOnlyList<CellRecord>> ManyAsync(int datasetId, int[] cellIds, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand($"SELECT {Columns} FROM cell WHERE dataset_id = $1 AND cell_id = ANY($2) ORDER BY cell_id");
        command.Parameters.AddWithValue(datasetId);
        command.Parameters.AddWithValue(cellIds);
        return await ReadCellsAsync(command, cancel);
    }

    private static async Task<IReadOnlyList<CellRecord>> ReadCellsAsync(NpgsqlCommand command, CancellationToken cancel)
    {
        var cells = new List<CellRecord>();
        await using var reader = await command.ExecuteReaderAsync(cancel);
        while (await reader.ReadAsync(cancel)) cells.Add(Read(reader));
        return cells;
    }

    public async Task<IReadOnlyList<(int A, int B, int C)>> TrianglesAsync(int datasetId, CancellationToken cancel = default)
    {
        await using var command = dataSource.CreateCommand(
            "SELECT node_a, node_b, node_c FROM mesh_triangle WHERE dataset_id = $1 ORDER BY triangle_id");
        command.Parameters.AddWithValue(datasetId);
        var list = new List<(int, int, int)>();
        await using var reader = await command.ExecuteReaderAsync(cancel);
        while (await reader.ReadAsync(cancel)) list.Add((reader.GetInt32(0), reader.GetInt32(1), reader.GetInt32(2)));
        return list;
    }

    public static async Task<int> CountAsync(NpgsqlConnection connection, NpgsqlTransaction? transaction, int datasetId, CancellationToken cancel)
    {
        await using var command = new NpgsqlCommand("SELECT count(*)::int FROM cell WHERE dataset_id = $1", connection, transaction);
        command.Parameters.AddWithValue(datasetId);
        return (int)(await command.ExecuteScalarAsync(cancel))!;
    }

    /// <summary>The ids of the wet cells of a dataset, ascending.</summary>
    public static async Task<int[]> WetCellIdsAsync(NpgsqlConnection connection, NpgsqlTransaction? transaction, int datasetId, CancellationToken cancel)
    {
        await using var command = new NpgsqlCommand("SELECT cell_id FROM cell WHERE dataset_id = $1 AND wet ORDER BY cell_id", connection, transaction);
        command.Parameters.AddWithValue(datasetId);
        var ids = new List<int>();
        await using var reader = await command.ExecuteReaderAsync(cancel);
        while (await reader.ReadAsync(cancel)) ids.Add(reader.GetInt32(0));
        return ids.ToArray();
    }

    private const string Columns = "cell_id, grid_i, grid_j, ST_X(geom), ST_Y(geom), depth_m, wet, coast_distance_m";

    private static CellRecord Read(NpgsqlDataReader reader) => new(
        reader.GetInt32(0),
        reader.IsDBNull(1) ? null : reader.GetInt32(1),
        reader.IsDBNull(2) ? null : reader.GetInt32(2),
        reader.GetDouble(3),
        reader.GetDouble(4),
        reader.IsDBNull(5) ? null : reader.GetFloat(5),
        reader.GetBoolean(6),
        reader.IsDBNull(7) ? null : reader.GetFloat(7));
}
