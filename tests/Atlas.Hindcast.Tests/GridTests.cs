namespace Atlas.Hindcast.Tests;

public sealed class GridTests
{
    private readonly NetCdfFixtures _fixtures = NetCdfFixtures.Shared;

    [Fact]
    public void RegularGridNumbersPointsRowMajorInFileOrder()
    {
        using var file = HindcastFile.Open(_fixtures.Path("regular_float.classic"));
        var grid = Assert.IsType<RegularLatLonGrid>(file.Grid);
        Assert.Equal(GridKind.Regular, grid.Kind);
        Assert.Equal((4, 3, 12), (grid.Nx, grid.Ny, grid.PointCount));
        // Reference: the latitude/longitude variables as netCDF4-python reads them.
        var lat = _fixtures.ReferenceValues("regular_float.classic", "latitude");
        var lon = _fixtures.ReferenceValues("regular_float.classic", "longitude");
        Assert.Equal(lat.Select(v => (double)v), grid.LatitudeAxis);
        Assert.Equal(lon.Select(v => (double)v), grid.LongitudeAxis);
        Assert.True(grid.LatitudeAscending);
        for (int j = 0; j < 3; j++)
            for (int i = 0; i < 4; i++)
            {
                int p = grid.PointIndex(i, j);
                Assert.Equal(j * 4 + i, p);
                Assert.Equal(lon[i], grid.Longitude(p));
                Assert.Equal(lat[j], grid.Latitude(p));
            }
    }

    [Fact]
    public void DescendingLatitudesStayInFileOrderAndZeroTo360LongitudesAreNormalised()
    {
        using var file = HindcastFile.Open(_fixtures.Path("packed.classic"));
        var grid = Assert.IsType<RegularLatLonGrid>(file.Grid);
        Assert.Equal([51.0, 50.0], grid.LatitudeAxis);
        Assert.False(grid.LatitudeAscending);
        // packed.cdl longitudes 170, 175, 180, 185, 190 degrees east, as [-180, 180).
        Assert.Equal([170.0, 175, -180, -175, -170], grid.LongitudeAxis);
        Assert.Equal(-175.0, grid.Longitude(grid.PointIndex(3, 1)));
        Assert.Equal(50.0, grid.Latitude(grid.PointIndex(3, 1)));
    }

    [Fact]
    public void OneDimensionalLatLonNamedByTheCoordinatesAttributeMakeARegularGrid()
    {
        using var file = HindcastFile.Open(_fixtures.Path("regular_auxiliary.classic"));
        var grid = Assert.IsType<RegularLatLonGrid>(file.Grid);
        // regular_auxiliary.cdl: lat = 30, 29.5; lon = 359, 359.5, 0 degrees east.
        Assert.Equal([30.0, 29.5], grid.LatitudeAxis);
        Assert.Equal([-1.0, -0.5, 0], grid.LongitudeAxis);
    }

    [Theory]
    [InlineData(180, -180)]
    [InlineData(350, -10)]
    [InlineData(-190, 170)]
    [InlineData(540, -180)]
    [InlineData(0, 0)]
    [InlineData(-180, -180)]
    [InlineData(179.5, 179.5)]
    public void LongitudesAreNormalisedIntoTheHalfOpenRange(double longitude, double expected) =>
        Assert.Equal(expected, HindcastGrid.NormaliseLongitude(longitude), 12);

    [Fact]
    public void CurvilinearGridTakesItsTwoDimensionalCoordinates()
    {
        const string name = "curvilinear.cdf5";
        using var file = HindcastFile.Open(_fixtures.Path(name));
        var grid = Assert.IsType<CurvilinearGrid>(file.Grid);
        Assert.Equal((GridKind.Curvilinear, 3, 2), (grid.Kind, grid.Nx, grid.Ny));
        Assert.Equal(("lon2d", "lat2d"), (grid.LongitudeVariable, grid.LatitudeVariable));
        // Reference: lon2d/lat2d as netCDF4-python reads them, flattened row-major like the points.
        Assert.Equal(_fixtures.ReferenceValues(name, "lon2d"), grid.Longitudes.ToArray().Select(v => (float)v));
        Assert.Equal(_fixtures.ReferenceValues(name, "lat2d"), grid.Latitudes.ToArray().Select(v => (float)v));
        var hs = new float[12];
        file.ReadSteps(WaveParameter.Hs, 0, 2, 0, 6, hs);
        FloatAssert.Close(_fixtures.ReferenceValues(name, "hs"), hs, 0, "hs");
    }

    [Fact]
    public void ProjectedGridKeepsItsAxesAndMappingAndLocatesPointsByAuxiliaryLatLon()
    {
        const string name = "projected.nc4";
        using var file = HindcastFile.Open(_fixtures.Path(name));
        var grid = Assert.IsType<ProjectedGrid>(file.Grid);
        Assert.Equal((GridKind.Projected, 3, 2), (grid.Kind, grid.Nx, grid.Ny));
        Assert.Equal("transverse_mercator", grid.GridMappingName);
        Assert.Equal(0.9996, grid.GridMapping.Single(a => a.Name == "scale_factor_at_central_meridian").Values[0]);
        Assert.Equal([400000.0, 401000, 402000], grid.XAxis);
        Assert.Equal([5500000.0, 5501000], grid.YAxis);
        Assert.Equal(_fixtures.ReferenceValues(name, "lat"), grid.Latitudes.ToArray().Select(v => (float)v));
        Assert.Equal(_fixtures.ReferenceValues(name, "lon"), grid.Longitudes.ToArray().Select(v => (float)v));
    }

    [Fact]
    public void ProjectedGridWithoutLatLonIsRefusedSayingWhatIsMissing()
    {
        string path = _fixtures.Path("projected_without_latlon.classic");
        var e = Assert.Throws<HindcastFormatException>(() => HindcastFile.Open(path));
        Assert.Equal("hs", e.Variable);
        Assert.Contains("grid_mapping 'transverse_mercator'", e.Problem);
        Assert.Contains("does not evaluate map projections", e.Problem);
        Assert.Contains("2-D latitude and longitude", e.Problem);
    }

    [Fact]
    public void UgridMeshKeepsTrianglesSplitsQuadsAndHonoursStartIndex()
    {
        const string name = "ugrid_mesh.nc4classic";
        using var file = HindcastFile.Open(_fixtures.Path(name));
        var mesh = Assert.IsType<MeshGrid>(file.Grid);
        Assert.Equal((GridKind.Mesh, "Mesh2", 6), (mesh.Kind, mesh.MeshName, mesh.PointCount));
        // ugrid_mesh.cdl faces (1-based): 1-2-4, 2-5-4, quad 2-3-6-5 -> fan 2-3-6, 2-6-5; zero-based here.
        Assert.Equal([0, 1, 3, 1, 4, 3, 1, 2, 5, 1, 5, 4], mesh.Triangles.ToArray());
        Assert.Equal(4, mesh.TriangleCount);
        Assert.Equal(_fixtures.ReferenceValues(name, "Mesh2_node_x"), mesh.Longitudes.ToArray().Select(v => (float)v));
        Assert.Equal(_fixtures.ReferenceValues(name, "Mesh2_node_y"), mesh.Latitudes.ToArray().Select(v => (float)v));
    }

    [Fact]
    public void MeshNodeDataReadAsNetCdf4PythonReadsThem()
    {
        const string name = "ugrid_mesh.nc4classic";
        using var file = HindcastFile.Open(_fixtures.Path(name));
        var hs = new float[3 * 6];
        file.ReadSteps(WaveParameter.Hs, 0, 3, 0, 6, hs);
        FloatAssert.Close(_fixtures.ReferenceValues(name, "hs"), hs, 0, "hs");
        var part = new float[2 * 3];
        file.ReadSteps(WaveParameter.Te, 1, 2, 2, 3, part);
        Assert.Equal([7.2f, 7.3f, 7.4f, 8.2f, 8.3f, 8.4f], part);
        // Node 5 has depth 0 (land) and no Hs; the others are wet.
        Assert.Equal([true, true, true, true, true, false], file.ReadWetMask());
    }

    [Fact]
    public void FilesOnOneGridAreTheSameAndAShiftedGridIsNot()
    {
        using var classic = HindcastFile.Open(_fixtures.Path("regular_float.classic"));
        using var nc4 = HindcastFile.Open(_fixtures.Path("regular_float.nc4"));
        using var shifted = HindcastFile.Open(_fixtures.Path("regular_shifted.classic"));
        using var mesh = HindcastFile.Open(_fixtures.Path("ugrid_mesh.nc4classic"));
        Assert.True(classic.Grid.IsSameAs(nc4.Grid));
        // regular_shifted.cdl moves the last latitude by 0.01 degree.
        Assert.False(classic.Grid.IsSameAs(shifted.Grid));
        Assert.True(classic.Grid.IsSameAs(shifted.Grid, toleranceDegrees: 0.011));
        Assert.False(classic.Grid.IsSameAs(mesh.Grid));
        Assert.False(mesh.Grid.IsSameAs(classic.Grid));
    }

    [Fact]
    public void LongitudesEitherSideOfTheAntimeridianAreClose()
    {
        var a = new RegularLatLonGrid([179.999999], [0]);
        var b = new RegularLatLonGrid([-180.0], [0]);
        Assert.True(a.IsSameAs(b, 1e-5));
    }
}
