namespace Atlas.Hindcast.Tests;

/// <summary>Packing, fill values, valid ranges, units and direction conventions, checked against netCDF4-python's reading.</summary>
public sealed class CfValueDecodingTests
{
    private readonly NetCdfFixtures _fixtures = NetCdfFixtures.Shared;

    [Theory]
    [InlineData("packed.classic")]
    [InlineData("packed.nc4")]
    public void PackedIntegersDecodeAsNetCdf4PythonReadsThem(string name)
    {
        using var file = HindcastFile.Open(_fixtures.Path(name));
        // Reference: netCDF4-python with auto mask and scale (read_back.py). Tolerance 2e-6: it unpacks in float32
        // when scale_factor is float32, this reader in double, rounding once to float32.
        foreach (var (wave, variable) in new[] { (WaveParameter.Hs, "hs"), (WaveParameter.Te, "te"), (WaveParameter.Dir, "dir"), (WaveParameter.Tp, "tp") })
            FloatAssert.Close(_fixtures.ReferenceValues(name, variable), ReadAll(file, wave), 2e-6 * 40, $"{name} {variable}");
    }

    [Fact]
    public void Int16FillValueAndValidMinAreMissing()
    {
        using var file = HindcastFile.Open(_fixtures.Path("packed.classic"));
        var hs = ReadAll(file, WaveParameter.Hs);
        // packed.cdl: stored -32767 is _FillValue; -600 and -499 lie below valid_min = 0 (compared with the
        // stored values, as netCDF4-python does); stored 0 is valid and decodes to add_offset 0.5 m.
        Assert.True(float.IsNaN(hs[2]));
        Assert.True(float.IsNaN(hs[5]));
        Assert.True(float.IsNaN(hs[18]));
        Assert.Equal(0.5f, hs[17]);
        Assert.Equal(32.5f, hs[15], 5);
    }

    [Fact]
    public void Int32WithoutFillValueTreatsTheNetCdfDefaultFillAsMissing()
    {
        using var file = HindcastFile.Open(_fixtures.Path("packed.classic"));
        var te = ReadAll(file, WaveParameter.Te);
        // netcdf.h NC_FILL_INT = -2147483647 stored at indices 5 and 19 of packed.cdl.
        Assert.True(float.IsNaN(te[5]));
        Assert.True(float.IsNaN(te[19]));
        Assert.Equal(6f, te[0], 5); // -20000 * 0.0001 + 8
    }

    [Fact]
    public void Int8DirectionWithItsFillValueDecodesIntoDegrees()
    {
        using var file = HindcastFile.Open(_fixtures.Path("packed.classic"));
        var dir = ReadAll(file, WaveParameter.Dir);
        Assert.Equal(0f, dir[0]);      // -120 * 1.5 + 180
        Assert.Equal(358.5f, dir[4]);  // 119 * 1.5 + 180
        Assert.True(float.IsNaN(dir[5])); // -128 is _FillValue
    }

    [Fact]
    public void NaNFillValueLeavesMissingValuesMissing()
    {
        using var file = HindcastFile.Open(_fixtures.Path("packed.classic"));
        var tp = ReadAll(file, WaveParameter.Tp);
        Assert.True(float.IsNaN(tp[5]));
        Assert.Equal(8f, tp[0]);
    }

    [Fact]
    public void CentimetresAndSecondsAreConvertedToMetresAndSeconds()
    {
        const string name = "units_to_direction.offset64";
        using var file = HindcastFile.Open(_fixtures.Path(name));
        // 1 cm = 0.01 m (SI Brochure, BIPM). Reference values: netCDF4-python, which does not convert units.
        FloatAssert.Close(FloatAssert.Map(_fixtures.ReferenceValues(name, "hs"), v => v / 100), ReadAll(file, WaveParameter.Hs), 1e-6, "hs");
        FloatAssert.Close(_fixtures.ReferenceValues(name, "te"), ReadAll(file, WaveParameter.Te), 0, "te (units 'second')");
    }

    [Fact]
    public void ToDirectionInRadiansBecomesFromDirectionInDegrees()
    {
        const string name = "units_to_direction.offset64";
        using var file = HindcastFile.Open(_fixtures.Path(name));
        Assert.True(file.Source(WaveParameter.Dir)!.Towards);
        // 1 rad = 180/pi degrees; waves travelling to theta come from theta + 180 (CF standard names
        // sea_surface_wave_to_direction / _from_direction); wrapped into [0, 360). Tolerance 1e-4 degree.
        var expected = FloatAssert.Map(_fixtures.ReferenceValues(name, "dirto"),
            v => (float)(((v * 180 / Math.PI + 180) % 360 + 360) % 360));
        var dir = ReadAll(file, WaveParameter.Dir);
        FloatAssert.Close(expected, dir, 1e-4, "dir");
        Assert.Equal(180f, dir[0], 4); // to 0 rad (north) = from south
        Assert.Equal(270f, dir[1], 4); // to pi/2 (east) = from west
        Assert.Equal(0f, dir[2], 4);   // to pi (south) = from north
        Assert.Equal(90f, dir[6], 4);  // to -pi/2 = to west = from east
        Assert.All(dir, d => Assert.InRange(d, 0f, 359.9999f));
    }

    [Fact]
    public void SpreadInRadiansBecomesDegrees()
    {
        const string name = "units_to_direction.offset64";
        using var file = HindcastFile.Open(_fixtures.Path(name));
        var expected = FloatAssert.Map(_fixtures.ReferenceValues(name, "spread"), v => (float)(v * 180 / Math.PI));
        FloatAssert.Close(expected, ReadAll(file, WaveParameter.Spread), 1e-4, "spread");
    }

    [Fact]
    public void AltitudeBecomesDepthWithLandMissing()
    {
        using var file = HindcastFile.Open(_fixtures.Path("units_to_direction.offset64"));
        Assert.True(file.Source(WaveParameter.Depth)!.PositiveUp);
        // units_to_direction.cdl: elevation -20, -15.5, 3, -100, 0, -0.5 (positive up); a sea floor at or above
        // the surface is land.
        Assert.Equal([20f, 15.5f, float.NaN, 100f, float.NaN, 0.5f], file.ReadDepth());
    }

    [Fact]
    public void UnitsThatCannotBeConvertedNameFileVariableAndUnits()
    {
        string path = _fixtures.Path("regular_float.classic");
        var mapping = new VariableMapping(new Dictionary<WaveParameter, string>(),
            units: new Dictionary<WaveParameter, string> { [WaveParameter.Hs] = "m s-1" });
        var e = Assert.Throws<HindcastFormatException>(() => HindcastFile.Open(path, mapping));
        Assert.Equal(path, e.File);
        Assert.Equal("hs", e.Variable);
        Assert.Equal($"{path}: variable 'hs': units 'm s-1' cannot be converted to metres", e.Message);
    }

    private static float[] ReadAll(HindcastFile file, WaveParameter v) => HindcastFileTests.ReadAll(file, v);
}
