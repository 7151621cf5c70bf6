namespace Atlas.Hindcast;

/// <summary>The grid of a data variable and the file dimensions that carry it: (y, x) for 2-D grids, (node) for a mesh.</summary>
internal sealed record SpatialLayout(HindcastGrid Grid, IReadOnlyList<NetCdfDimension> Dimensions);

/// <summary>
/// Works out the horizontal grid of a data variable from CF and UGRID metadata: 1-D latitude/longitude coordinate
/// variables (regular), 2-D latitude/longitude named by the coordinates attribute (curvilinear), projection x/y
/// with a grid_mapping plus 2-D latitude/longitude (projected), or a mesh_topology with data on nodes (UGRID).
/// </summary>
internal static class CfGridReader
{
    private static readonly string[] LatitudeUnits = ["degrees_north", "degree_north", "degree_N", "degrees_N", "degreeN", "degreesN"];
    private static readonly string[] LongitudeUnits = ["degrees_east", "degree_east", "degree_E", "degrees_E", "degreeE", "degreesE"];

    /// <summary>Throws <see cref="HindcastFormatException"/> naming the data variable when no supported grid can be found.</summary>
    public static SpatialLayout Read(NetCdfFile file, NetCdfVariable data, NetCdfDimension? time)
    {
        if (data.TextAttribute("mesh") is { Length: > 0 } mesh) return ReadMesh(file, data, time, mesh);

        var spatial = data.Dimensions.Where(d => d != time && !(d.Length == 1 && !HasHorizontalCoordinate(file, d))).ToList();
        if (spatial.Count == 1)
            throw Fail(file, data, $"has one horizontal dimension ('{spatial[0].Name}') but no UGRID 'mesh' attribute; " +
                "unstructured data must name its mesh_topology variable");
        if (spatial.Count != 2)
            throw Fail(file, data, $"has horizontal dimensions ({string.Join(", ", spatial.Select(d => d.Name))}); exactly two (y, x) are required for a grid");
        var (ydim, xdim) = (spatial[0], spatial[1]);

        var ycoord = CoordinateVariable(file, ydim);
        var xcoord = CoordinateVariable(file, xdim);
        if (ycoord is not null && xcoord is not null)
        {
            if (IsLatitude(ycoord) && IsLongitude(xcoord))
                return new SpatialLayout(new RegularLatLonGrid(ReadCoordinate(file, xcoord), ReadCoordinate(file, ycoord)), [ydim, xdim]);
            if (IsLongitude(ycoord) && IsLatitude(xcoord))
                throw Fail(file, data, $"is stored (…, {ydim.Name}, {xdim.Name}) with longitude before latitude; " +
                    "only (…, latitude, longitude) order is supported (reorder the dimensions of the file)");
        }

        // 1-D latitude/longitude named in the coordinates attribute rather than as coordinate variables.
        var named = Named(file, data).Where(v => v.Rank == 1).ToList();
        if (named.FirstOrDefault(v => IsLatitude(v) && v.Dimensions[0] == ydim) is { } lat1d &&
            named.FirstOrDefault(v => IsLongitude(v) && v.Dimensions[0] == xdim) is { } lon1d)
            return new SpatialLayout(new RegularLatLonGrid(ReadCoordinate(file, lon1d), ReadCoordinate(file, lat1d)), [ydim, xdim]);

        var mapping = GridMapping(file, data);
        var (lon2d, lat2d) = AuxiliaryLatLon(file, data, ydim, xdim);
        bool projectedAxes = ycoord is not null && xcoord is not null && (IsProjectionAxis(xcoord) || IsProjectionAxis(ycoord) ||
            mapping is not null && mapping.Value.Name != "latitude_longitude");
        if (projectedAxes)
        {
            if (lon2d is null || lat2d is null)
                throw Fail(file, data,
                    $"is on projected x/y axes ('{xcoord!.Name}', '{ycoord!.Name}'{(mapping is null ? "" : $", grid_mapping '{mapping.Value.Name}'")}) " +
                    "without 2-D latitude/longitude auxiliary coordinates; this reader does not evaluate map projections, so the file " +
                    "must carry 2-D latitude and longitude variables named in the data's 'coordinates' attribute");
            return new SpatialLayout(new ProjectedGrid(ReadCoordinate(file, xcoord!), ReadCoordinate(file, ycoord!),
                mapping?.Name ?? "unknown", mapping?.Attributes ?? [], ReadCoordinate(file, lon2d), ReadCoordinate(file, lat2d)), [ydim, xdim]);
        }
        if (lon2d is not null && lat2d is not null)
            return new SpatialLayout(new CurvilinearGrid((int)xdim.Length, (int)ydim.Length, ReadCoordinate(file, lon2d),
                ReadCoordinate(file, lat2d), lon2d.Name, lat2d.Name), [ydim, xdim]);

        throw Fail(file, data, $"cannot be located: dimensions ({ydim.Name}, {xdim.Name}) have no latitude/longitude coordinate variables " +
            "and no 2-D latitude/longitude variables are named in its 'coordinates' attribute");
    }

    private static SpatialLayout ReadMesh(NetCdfFile file, NetCdfVariable data, NetCdfDimension? time, string meshName)
    {
        var mesh = file.FindVariable(meshName)
            ?? throw Fail(file, data, $"names mesh '{meshName}', which is not a variable of the file");
        if (mesh.TextAttribute("cf_role") != "mesh_topology")
            throw new HindcastFormatException(file.Path, mesh.Name, "is named as a mesh but has no cf_role = \"mesh_topology\"");
        if (mesh.NumberAttribute("topology_dimension") is not 2)
            throw new HindcastFormatException(file.Path, mesh.Name, "has topology_dimension other than 2; only 2-D meshes are supported");
        string location = data.TextAttribute("location") ?? "";
        if (location != "node")
            throw Fail(file, data, $"is on mesh location '{location}'; only data on the mesh nodes (location = \"node\") are supported");

        var nodeCoordinates = (mesh.TextAttribute("node_coordinates") ?? "")
            .Split(' ', StringSplitOptions.RemoveEmptyEntries)
            .Select(file.FindVariable).OfType<NetCdfVariable>()
            .Concat(Named(file, data)).Where(v => v.Rank == 1).ToList();
        var lon = nodeCoordinates.FirstOrDefault(IsLongitude);
        var lat = nodeCoordinates.FirstOrDefault(IsLatitude);
        if (lon is null || lat is null)
            throw new HindcastFormatException(file.Path, mesh.Name,
                "has no longitude/latitude node coordinates (node_coordinates, or the data's coordinates attribute, must name variables in degrees_east/degrees_north)");
        var nodeDim = lon.Dimensions[0];
        if (lat.Dimensions[0] != nodeDim)
            throw new HindcastFormatException(file.Path, mesh.Name, $"node coordinates '{lon.Name}' and '{lat.Name}' are on different dimensions");

        var spatial = data.Dimensions.Where(d => d != time && !(d.Length == 1 && d != nodeDim)).ToList();
        if (spatial.Count != 1 || spatial[0] != nodeDim)
            throw Fail(file, data, $"has horizontal dimensions ({string.Join(", ", spatial.Select(d => d.Name))}); node data on '{nodeDim.Name}' are required");

        var triangles = ReadTriangles(file, mesh, (int)nodeDim.Length);
        return new SpatialLayout(new MeshGrid(mesh.Name, ReadCoordinate(file, lon), ReadCoordinate(file, lat), triangles), [nodeDim]);
    }

    private static int[] ReadTriangles(NetCdfFile file, NetCdfVariable mesh, int nodeCount)
    {
        string connectivityName = mesh.TextAttribute("face_node_connectivity")
            ?? throw new HindcastFormatException(file.Path, mesh.Name, "has no face_node_connectivity attribute");
        var connectivity = file.FindVariable(connectivityName)
            ?? throw new HindcastFormatException(file.Path, mesh.Name, $"names face_node_connectivity '{connectivityName}', which is not in the file");
        if (connectivity.Rank != 2 || !connectivity.Type.IsInteger())
            throw new HindcastFormatException(file.Path, connectivityName, "must be a 2-D integer variable (faces, nodes per face)");

        // UGRID lets the face dimension come second when the mesh says so in face_dimension.
        bool transposed = mesh.TextAttribute("face_dimension") is { } faceDim && connectivity.Dimensions[1].Name == faceDim
                          && connectivity.Dimensions[0].Name != faceDim;
        int faces = (int)connectivity.Dimensions[transposed ? 1 : 0].Length;
        int perFace = (int)connectivity.Dimensions[transposed ? 0 : 1].Length;
        long startIndex = (long)(connectivity.NumberAttribute("start_index") ?? 0);
        double? fill = connectivity.NumberAttribute("_FillValue");
        var raw = file.ReadAll<long>(connectivity);

        var triangles = new List<int>(faces * 3);
        var corners = new List<int>(perFace);
        for (int f = 0; f < faces; f++)
        {
            corners.Clear();
            for (int k = 0; k < perFace; k++)
            {
                long value = transposed ? raw[(long)k * faces + f] : raw[(long)f * perFace + k];
                if (fill is not null && value == (long)fill.Value) continue;
                long node = value - startIndex;
                if (node < 0 || node >= nodeCount)
                    throw new HindcastFormatException(file.Path, connectivityName,
                        $"face {f} refers to node {value}, outside {startIndex}..{startIndex + nodeCount - 1} (start_index {startIndex})");
                corners.Add((int)node);
            }
            if (corners.Count < 3)
                throw new HindcastFormatException(file.Path, connectivityName, $"face {f} has {corners.Count} nodes; at least 3 are required");
            for (int k = 1; k + 1 < corners.Count; k++)
            {
                triangles.Add(corners[0]);
                triangles.Add(corners[k]);
                triangles.Add(corners[k + 1]);
            }
        }
        return triangles.ToArray();
    }

    private static (NetCdfVariable? Lon, NetCdfVariable? Lat) AuxiliaryLatLon(NetCdfFile file, NetCdfVariable data, NetCdfDimension ydim, NetCdfDimension xdim)
    {
        var named = Named(file, data).Where(v => v.Rank == 2).ToList();
        // Files that omit the coordinates attribute but carry exactly one 2-D latitude and longitude are accepted too.
        var pool = named.Count > 0 ? named : file.Variables.Where(v => v.Rank == 2).ToList();
        var lons = pool.Where(IsLongitude).ToList();
        var lats = pool.Where(IsLatitude).ToList();
        if (lons.Count != 1 || lats.Count != 1) return (null, null);
        foreach (var v in new[] { lons[0], lats[0] })
        {
            if (v.Dimensions[0] == xdim && v.Dimensions[1] == ydim)
                throw new HindcastFormatException(file.Path, v.Name,
                    $"is dimensioned ({xdim.Name}, {ydim.Name}) while the data are ({ydim.Name}, {xdim.Name}); the axes must be in the same order");
            if (v.Dimensions[0] != ydim || v.Dimensions[1] != xdim)
                return (null, null);
        }
        return (lons[0], lats[0]);
    }

    /// <summary>The variables the data's coordinates attribute names (names not in the file are ignored).</summary>
    private static IEnumerable<NetCdfVariable> Named(NetCdfFile file, NetCdfVariable data) =>
        (data.TextAttribute("coordinates") ?? "").Split(' ', StringSplitOptions.RemoveEmptyEntries)
            .Select(file.FindVariable).OfType<NetCdfVariable>();

    private static (string Name, IReadOnlyList<NetCdfAttribute> Attributes)? GridMapping(NetCdfFile file, NetCdfVariable data)
    {
        // grid_mapping is either a variable name or the extended form "crs: x y".
        string? text = data.TextAttribute("grid_mapping");
        if (string.IsNullOrWhiteSpace(text)) return null;
        string name = text.Split([' ', ':'], StringSplitOptions.RemoveEmptyEntries)[0];
        var mapping = file.FindVariable(name)
            ?? throw Fail(file, data, $"names grid_mapping '{name}', which is not a variable of the file");
        return (mapping.TextAttribute("grid_mapping_name") ?? "unnamed", mapping.Attributes);
    }

    private static NetCdfVariable? CoordinateVariable(NetCdfFile file, NetCdfDimension dim) =>
        file.FindVariable(dim.Name) is { Rank: 1 } v && v.Dimensions[0] == dim ? v : null;

    private static bool HasHorizontalCoordinate(NetCdfFile file, NetCdfDimension dim) =>
        CoordinateVariable(file, dim) is { } v && (IsLatitude(v) || IsLongitude(v) || IsProjectionAxis(v) ||
            v.TextAttribute("axis") is "X" or "Y");

    internal static bool IsLatitude(NetCdfVariable v) =>
        v.TextAttribute("standard_name") == "latitude" || LatitudeUnits.Contains(v.TextAttribute("units") ?? "");

    internal static bool IsLongitude(NetCdfVariable v) =>
        v.TextAttribute("standard_name") == "longitude" || LongitudeUnits.Contains(v.TextAttribute("units") ?? "");

    private static bool IsProjectionAxis(NetCdfVariable v) => v.TextAttribute("standard_name") is
        "projection_x_coordinate" or "projection_y_coordinate" or "grid_longitude" or "grid_latitude" or
        "projection_x_angular_coordinate" or "projection_y_angular_coordinate";

    /// <summary>Reads a coordinate as double with its fill values as NaN and any packing applied.</summary>
    internal static double[] ReadCoordinate(NetCdfFile file, NetCdfVariable v)
    {
        var values = file.ReadAll<double>(v);
        var missing = new List<double>();
        foreach (var name in new[] { "_FillValue", "missing_value" })
            if (v.Attribute(name) is { IsText: false } a) missing.AddRange(a.Values.Select(x => v.Type == NetCdfType.Float ? (float)x : x));
        if (v.Attribute("_FillValue") is null && v.Type.IsNumeric()) missing.Add(v.Type.DefaultFillValue());
        double scale = v.NumberAttribute("scale_factor") ?? 1, offset = v.NumberAttribute("add_offset") ?? 0;
        for (int k = 0; k < values.Length; k++)
            values[k] = missing.Contains(values[k]) ? double.NaN : values[k] * scale + offset;
        return values;
    }

    private static HindcastFormatException Fail(NetCdfFile file, NetCdfVariable data, string problem) =>
        new(file.Path, data.Name, problem);
}
