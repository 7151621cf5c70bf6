namespace Atlas.Hindcast;

/// <summary>
/// A grid on projection x/y axes described by a CF grid_mapping. Point positions come from the file's 2-D
/// latitude/longitude auxiliary coordinates: this reader does not evaluate map projections itself.
/// </summary>
public sealed class ProjectedGrid : StructuredGrid
{
    public ProjectedGrid(double[] xAxis, double[] yAxis, string gridMappingName, IReadOnlyList<NetCdfAttribute> gridMapping,
        double[] pointLongitudes, double[] pointLatitudes)
        : base(xAxis.Length, yAxis.Length, pointLongitudes, pointLatitudes)
    {
        XAxis = xAxis;
        YAxis = yAxis;
        GridMappingName = gridMappingName;
        GridMapping = gridMapping;
    }

    public override GridKind Kind => GridKind.Projected;

    /// <summary>Projection x of each column, in the units of the file's x coordinate.</summary>
    public IReadOnlyList<double> XAxis { get; }

    /// <summary>Projection y of each row.</summary>
    public IReadOnlyList<double> YAxis { get; }

    /// <summary>The CF grid_mapping_name, e.g. "transverse_mercator".</summary>
    public string GridMappingName { get; }

    /// <summary>All attributes of the grid-mapping variable (projection parameters, crs_wkt if given).</summary>
    public IReadOnlyList<NetCdfAttribute> GridMapping { get; }
}
