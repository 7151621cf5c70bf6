using System.Security.Cryptography;
using System.Text.Json;
using System.Text.Json.Nodes;
using Atlas.Hindcast;
using Atlas.Storage.Datasets;

namespace Atlas.Ingest.Ingestion;

/// <summary>
/// What the store keeps of a hindcast grid: its kind and shape, the axes of a regular grid (layers are drawn on
/// them), the triangles of a mesh, and a fingerprint of every point's position for checking later files against it.
/// </summary>
public sealed class GridDescription
{
    private readonly HindcastGrid _grid;

    private GridDescription(HindcastGrid grid) => _grid = grid;

    public static GridDescription Of(HindcastGrid grid) => new(grid);

    public string Kind => _grid.Kind.ToString().ToLowerInvariant();
    public int PointCount => _grid.PointCount;
    public int? Nx => (_grid as StructuredGrid)?.Nx;
    public int? Ny => (_grid as StructuredGrid)?.Ny;
    public double Longitude(int point) => _grid.Longitude(point);
    public double Latitude(int point) => _grid.Latitude(point);

    public (int? I, int? J) IndexOf(int point) =>
        _grid is StructuredGrid s ? (point % s.Nx, point / s.Nx) : (null, null);

    public IReadOnlyList<(int A, int B, int C)>? Triangles
    {
        get
        {
            if (_grid is not MeshGrid mesh) return null;
            var nodes = mesh.Triangles;
            var list = new List<(int, int, int)>(mesh.TriangleCount);
            for (var t = 0; t < mesh.TriangleCount; t++) list.Add((nodes[3 * t], nodes[3 * t + 1], nodes[3 * t + 2]));
            return list;
        }
    }

    /// <summary>SHA-256 of every point's position rounded to 1e-5 degree (the tolerance files are compared with).</summary>
    public string Fingerprint
    {
        get
        {
            using var hash = IncrementalHash.CreateHash(HashAlgorithmName.SHA256);
            Span<byte> bytes = stackalloc byte[16];
            for (var p = 0; p < _grid.PointCount; p++)
            {
                BitConverter.TryWriteBytes(bytes, Math.Round(_grid.Longitude(p) * 1e5));
                BitConverter.TryWriteBytes(bytes[8..], Math.Round(_grid.Latitude(p) * 1e5));
                hash.AppendData(bytes);
            }
            return Convert.ToHexStringLower(hash.GetHashAndReset());
        }
    }

    public string Describe() => Nx is { } nx ? $"{Kind} {nx} x {Ny}" : _grid is MeshGrid ? $"{Kind}, {PointCount} nodes" : $"{Kind}, {PointCount} points";

    /// <summary>The jsonb document stored in dataset.grid.</summary>
    public string ToJson()
    {
        var json = new JsonObject
        {
            ["kind"] = Kind,
            ["point_count"] = PointCount,
            ["fingerprint"] = Fingerprint,
        };
        if (Nx is { } nx) { json["nx"] = nx; json["ny"] = Ny; }
        if (_grid is RegularLatLonGrid regular)
        {
            json["longitudes"] = new JsonArray(regular.LongitudeAxis.Select(v => (JsonNode)JsonValue.Create(Math.Round(v, 8))).ToArray());
            json["latitudes"] = new JsonArray(regular.LatitudeAxis.Select(v => (JsonNode)JsonValue.Create(Math.Round(v, 8))).ToArray());
        }
        if (_grid is ProjectedGrid projected) json["grid_mapping"] = projected.GridMappingName;
        if (_grid is MeshGrid mesh) { json["mesh"] = mesh.MeshName; json["triangle_count"] = mesh.TriangleCount; }
        if (_grid is Hindcast.Spectra.StationGrid stations) json["stations"] = new JsonArray([.. stations.Names.Select(n => (JsonNode)JsonValue.Create(n))]);
        return json.ToJsonString();
    }

    /// <summary>True when the stored dataset's grid is this one (same kind, shape and point fingerprint).</summary>
    public static bool Matches(DatasetRecord dataset, GridDescription grid)
    {
        if (dataset.GridKind != grid.Kind || dataset.PointCount != grid.PointCount || dataset.Nx != grid.Nx || dataset.Ny != grid.Ny) return false;
        using var document = JsonDocument.Parse(dataset.GridJson);
        return document.RootElement.TryGetProperty("fingerprint", out var stored) && stored.GetString() == grid.Fingerprint;
    }
}
