namespace Atlas.Hindcast;

/// <summary>
/// A UGRID 2-D mesh with data on its nodes. Faces with more than three nodes are split into triangles by a fan
/// from their first node (a quad a-b-c-d gives a-b-c and a-c-d); <see cref="Triangles"/> holds zero-based node
/// indices, three per triangle.
/// </summary>
public sealed class MeshGrid : HindcastGrid
{
    private readonly int[] _triangles;

    public MeshGrid(string meshName, double[] nodeLongitudes, double[] nodeLatitudes, int[] triangles)
        : base(nodeLongitudes, nodeLatitudes)
    {
        if (triangles.Length % 3 != 0) throw new ArgumentException("triangles need three node indices each", nameof(triangles));
        foreach (int n in triangles)
            if ((uint)n >= (uint)nodeLongitudes.Length) throw new ArgumentOutOfRangeException(nameof(triangles), $"node index {n} is outside 0..{nodeLongitudes.Length - 1}");
        MeshName = meshName;
        _triangles = triangles;
    }

    public override GridKind Kind => GridKind.Mesh;

    /// <summary>Name of the mesh_topology variable.</summary>
    public string MeshName { get; }

    /// <summary>Zero-based node indices, three per triangle.</summary>
    public ReadOnlySpan<int> Triangles => _triangles;

    public int TriangleCount => _triangles.Length / 3;

    public override bool IsSameAs(HindcastGrid other, double toleranceDegrees = 1e-5) =>
        other is MeshGrid m && m._triangles.AsSpan().SequenceEqual(_triangles) && base.IsSameAs(other, toleranceDegrees);
}
