namespace Atlas.Hindcast;

/// <summary>A 2-D grid located by 2-D latitude/longitude variables (the data's coordinates attribute).</summary>
public sealed class CurvilinearGrid : StructuredGrid
{
    public CurvilinearGrid(int nx, int ny, double[] pointLongitudes, double[] pointLatitudes, string longitudeVariable, string latitudeVariable)
        : base(nx, ny, pointLongitudes, pointLatitudes)
    {
        LongitudeVariable = longitudeVariable;
        LatitudeVariable = latitudeVariable;
    }

    public override GridKind Kind => GridKind.Curvilinear;

    public string LongitudeVariable { get; }
    public string LatitudeVariable { get; }
}
