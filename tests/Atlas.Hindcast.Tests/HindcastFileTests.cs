using System.Text.Json;

namespace Atlas.Hindcast.Tests;

public sealed class HindcastFileTests
{
    private readonly NetCdfFixtures _fixtures = NetCdfFixtures.Shared;

    private static readonly (WaveParameter Wave, string Name)[] RegularVariables =
        [(WaveParameter.Hs, "hs"), (WaveParameter.Te, "te"), (WaveParameter.Tp, "tp"), (WaveParameter.Dir, "mwd"), (WaveParameter.Spread, "spr")];

    [Theory]
    [InlineData("classic")]
    [InlineData("offset64")]
    [InlineData("cdf5")]
    [InlineData("nc4")]
    [InlineData("nc4classic")]
    public void EveryFormatDecodesTheValuesNetCdf4PythonReads(string kind)
    {
        string name = "regular_float." + kind;
        using var file = HindcastFile.Open(_fixtures.Path(name));
        Assert.Equal(4, file.TimesUtc.Count);
        Assert.Equal(new DateTime(2001, 1, 1, 3, 0, 0, DateTimeKind.Utc), file.TimesUtc[3]);
        foreach (var (wave, variable) in RegularVariables)
        {
            Assert.True(file.Has(wave));
            Assert.Equal(VariableMatch.StandardName, file.Source(wave)!.MatchedBy);
            // Reference: netCDF4-python (read_back.py); float data pass through unchanged, so exact.
            FloatAssert.Close(_fixtures.ReferenceValues(name, variable), ReadAll(file, wave), 0, $"{name} {variable}");
        }
    }

    [Fact]
    public void DecodedFloatValuesEqualNcdumpText()
    {
        string path = _fixtures.Path("regular_float.nc4");
        using var file = HindcastFile.Open(path);
        // Reference: `ncdump -v te`; "_" is the fill value, decoded as missing.
        FloatAssert.Close(NetCdfFileTests.NcdumpValues(path, "te"), ReadAll(file, WaveParameter.Te), 0, "te");
    }

    [Fact]
    public void CompressedChunkedPackedFileDecodesAsNetCdf4PythonReadsIt()
    {
        using var file = HindcastFile.Open(_fixtures.Path("compressed"));
        Assert.Equal(NetCdfFormat.NetCdf4, file.Format);
        Assert.Equal(48 * 600, file.TimesUtc.Count * file.Grid.PointCount);
        // Reference: netCDF4-python. Hs is int16 unpacked by it in float32 (scale_factor is float32): 2e-6 m.
        FloatAssert.Close(_fixtures.ReferenceValues("compressed", "hs"), ReadAll(file, WaveParameter.Hs), 2e-6, "hs");
        FloatAssert.Close(_fixtures.ReferenceValues("compressed", "te"), ReadAll(file, WaveParameter.Te), 0, "te");
        FloatAssert.Close(_fixtures.ReferenceValues("compressed", "tp"), ReadAll(file, WaveParameter.Tp), 1e-6, "tp (float64 rounded to float32)");
        FloatAssert.Close(_fixtures.ReferenceValues("compressed", "mwd"), ReadAll(file, WaveParameter.Dir), 0, "mwd");
    }

    [Fact]
    public void PackedHsLiesWithinHalfAPackingStepOfTheValuesBeforePacking()
    {
        using var file = HindcastFile.Open(_fixtures.Path("compressed"));
        using var source = JsonDocument.Parse(File.ReadAllText(_fixtures.CompressedSourceJson));
        var expected = source.RootElement.GetProperty("hs").EnumerateArray()
            .Select(v => v.ValueKind == JsonValueKind.Null ? float.NaN : (float)v.GetDouble()).ToArray();
        // make_compressed.py packs with scale_factor 0.0005: rounding error at most half a step, plus float32 rounding.
        FloatAssert.Close(expected, ReadAll(file, WaveParameter.Hs), 0.00025 + 2e-6, "hs");
    }

    [Theory]
    [InlineData(0, 48, 0, 600)]   // whole file
    [InlineData(0, 48, 60, 120)]  // whole rows
    [InlineData(5, 13, 7, 1)]     // one point
    [InlineData(0, 48, 31, 20)]   // part of one row
    [InlineData(3, 30, 17, 95)]   // starts and ends inside rows
    [InlineData(47, 1, 1, 599)]   // last step, all but the first point
    public void PointBlocksReadTheSameValuesAsTheWholeField(int timeStart, int timeCount, int pointStart, int pointCount)
    {
        using var file = HindcastFile.Open(_fixtures.Path("compressed"));
        var all = ReadAll(file, WaveParameter.Hs);
        var block = new float[timeCount * pointCount];
        file.ReadSteps(WaveParameter.Hs, timeStart, timeCount, pointStart, pointCount, block);
        for (int t = 0; t < timeCount; t++)
            for (int p = 0; p < pointCount; p++)
            {
                float want = all[(timeStart + t) * 600 + pointStart + p], got = block[t * pointCount + p];
                Assert.True(want.Equals(got), $"step {timeStart + t}, point {pointStart + p}: {got}, expected {want}");
            }
    }

    [Theory]
    [InlineData(48 * 30 * 10, 300)] // ten rows fit: one band of chunk rows (make_compressed.py chunks 6 x 10 x 15)
    [InlineData(48 * 30 * 15, 300)] // fifteen rows fit: cut back to whole chunk bands
    [InlineData(48 * 30 * 5, 150)]  // fewer rows than a chunk band: whole rows within the budget
    [InlineData(10, 30)]            // never less than one row
    [InlineData(1L << 30, 600)]     // everything fits
    public void PointBlocksAreWholeRowsAlignedWithChunkRows(long budget, int expected)
    {
        using var file = HindcastFile.Open(_fixtures.Path("compressed"));
        Assert.Equal(expected, file.PointBlockSize(budget));
    }

    [Fact]
    public void DepthIsPositiveDownWithLandAndMissingAsNaN()
    {
        using var file = HindcastFile.Open(_fixtures.Path("regular_float.classic"));
        // regular_float.cdl dpt: point 0 is _FillValue, point 5 is -2 m (above the surface).
        Assert.Equal([float.NaN, 12.5f, 20, 35, 8, float.NaN, 40, 55.5f, 30, 45, 60, 80], file.ReadDepth());
    }

    [Fact]
    public void DepthWithATimeDimensionIsItsTimeMean()
    {
        using var file = HindcastFile.Open(_fixtures.Path("depth_with_time.classic"));
        Assert.Equal("wd", file.Source(WaveParameter.Depth)!.Name);
        // depth_with_time.cdl, mean of the two steps: (10.5 + 11.5) / 2, (0 + 1) / 2, (30 + 31) / 2.
        Assert.Equal([11f, 0.5f, 30.5f], file.ReadDepth());
        var field = file.ReadDepthField();
        Assert.True(field.TimeVarying);
        Assert.Equal(2, field.Steps);
    }

    [Fact]
    public void WetMaskDriesPointsWithoutDepthOrWithoutHs()
    {
        using var file = HindcastFile.Open(_fixtures.Path("regular_float.classic"));
        var wet = file.ReadWetMask();
        Assert.Equal(Enumerable.Range(0, 12).Select(p => p is not (0 or 5)), wet);
        using var noDepth = HindcastFile.Open(_fixtures.Path("curvilinear.cdf5"));
        Assert.False(noDepth.Has(WaveParameter.Depth));
        Assert.All(noDepth.ReadDepth(), d => Assert.True(float.IsNaN(d)));
        Assert.Equal([true, true, true, true, true, false], noDepth.ReadWetMask());
    }

    [Fact]
    public void WetMaskOfTheCompressedFileFollowsItsLandBlock()
    {
        using var file = HindcastFile.Open(_fixtures.Path("compressed"));
        var wet = file.ReadWetMask(probeSteps: 6);
        // make_compressed.py: land where column < 4 and row < 6.
        for (int j = 0; j < 20; j++)
            for (int i = 0; i < 30; i++)
                Assert.Equal(!(i < 4 && j < 6), wet[j * 30 + i]);
    }

    [Fact]
    public void MissingHsIsRefusedWithAHintAtALookalikeName()
    {
        string path = _fixtures.Path("missing_hs.classic");
        var e = Assert.Throws<HindcastFormatException>(() => HindcastFile.Open(path));
        Assert.Equal(path, e.File);
        Assert.Contains("Hs is required", e.Problem);
        Assert.Contains("variable 'swh' looks like Hs by its name only", e.Problem);
        Assert.Contains("{ \"hs\": \"swh\" }", e.Problem);
    }

    [Fact]
    public void FirstAndSecondMomentPeriodsAreNotTakenForTe()
    {
        var e = Assert.Throws<HindcastFormatException>(() => HindcastFile.Open(_fixtures.Path("tm01_only.classic")));
        Assert.Contains("neither an energy period Te", e.Problem);
        Assert.Contains("'t01' is Tm01", e.Problem);
        Assert.Contains("'t02' is Tm02", e.Problem);
    }

    [Fact]
    public void MappingThatNamesTm01ForTeIsRefused()
    {
        var mapping = VariableMapping.Parse("""{ "te": "t01" }""", "tm01.json");
        var e = Assert.Throws<HindcastFormatException>(() => HindcastFile.Open(_fixtures.Path("tm01_only.classic"), mapping));
        Assert.Equal("t01", e.Variable);
        Assert.Contains("mapping 'tm01.json'", e.Problem);
        Assert.Contains("Tm01, which is not Te", e.Problem);
    }

    [Fact]
    public void MappingFileReadsModelSpecificNames()
    {
        var mapping = VariableMapping.Load(NetCdfFixtures.Source("mapped_names.json"));
        const string name = "mapped_names.classic";
        using var file = HindcastFile.Open(_fixtures.Path(name), mapping);
        Assert.True(file.Has(WaveParameter.Hs) && file.Has(WaveParameter.Te) && file.Has(WaveParameter.Dir) && file.Has(WaveParameter.Depth));
        Assert.False(file.Has(WaveParameter.Tp));
        Assert.Equal(VariableMatch.Mapping, file.Source(WaveParameter.Hs)!.MatchedBy);
        Assert.Equal("swh", file.Source(WaveParameter.Hs)!.Name);
        FloatAssert.Close(_fixtures.ReferenceValues(name, "swh"), ReadAll(file, WaveParameter.Hs), 0, "hs");
        // "dir_to": waves travelling to theta come from theta + 180, wrapped into [0, 360).
        Assert.Equal([180f, 270f, 90f, 0f, 179f, 225f], ReadAll(file, WaveParameter.Dir));
        // "depth_positive": "up" and units supplied by the mapping: bathy -50, -12.5, 4.
        Assert.Equal([50f, 12.5f, float.NaN], file.ReadDepth());
        Assert.Equal(new DateTime(2002, 1, 1, 3, 0, 0, DateTimeKind.Utc), file.TimesUtc[1]);
    }

    [Fact]
    public void WithoutItsMappingAFileWithModelNamesIsRefused()
    {
        var e = Assert.Throws<HindcastFormatException>(() => HindcastFile.Open(_fixtures.Path("mapped_names.classic")));
        Assert.Contains("Hs is required", e.Problem);
        Assert.Contains("'swh'", e.Problem);
    }

    [Fact]
    public void MappingThatNamesAnAbsentVariableIsRefused()
    {
        var mapping = VariableMapping.Parse("""{ "hs": "hsig" }""", "site.json");
        var e = Assert.Throws<HindcastFormatException>(() => HindcastFile.Open(_fixtures.Path("regular_float.classic"), mapping));
        Assert.Equal("hsig", e.Variable);
        Assert.Equal("the mapping 'site.json' names it for Hs, but the file has no such variable", e.Problem);
    }

    [Fact]
    public void PeakPeriodAloneIsEnough()
    {
        using var file = HindcastFile.Open(_fixtures.Path("calendar_noleap.classic"));
        Assert.True(file.Has(WaveParameter.Tp));
        Assert.False(file.Has(WaveParameter.Te));
        var e = Assert.Throws<InvalidOperationException>(() => file.ReadSteps(WaveParameter.Te, 0, 1, 0, 1, new float[1]));
        Assert.Contains("no Te", e.Message);
    }

    [Fact]
    public void ReadsOutsideTheFileOrIntoAShortBufferAreMisuse()
    {
        using var file = HindcastFile.Open(_fixtures.Path("regular_float.classic"));
        Assert.Throws<ArgumentOutOfRangeException>(() => file.ReadSteps(WaveParameter.Hs, 3, 2, 0, 1, new float[2]));
        Assert.Throws<ArgumentOutOfRangeException>(() => file.ReadSteps(WaveParameter.Hs, 0, 1, 10, 3, new float[3]));
        Assert.Throws<ArgumentException>(() => file.ReadSteps(WaveParameter.Hs, 0, 2, 0, 3, new float[5]));
        Assert.Throws<ArgumentException>(() => file.ReadSteps(WaveParameter.Depth, 0, 1, 0, 1, new float[1]));
    }

    [Fact]
    public void FormatErrorMessageNamesFileVariableAndProblem()
    {
        var e = new HindcastFormatException("/data/a.nc", "hs", "units 'K' cannot be converted to metres");
        Assert.Equal("/data/a.nc: variable 'hs': units 'K' cannot be converted to metres", e.Message);
        Assert.Equal("/data/a.nc: truncated", new HindcastFormatException("/data/a.nc", null, "truncated").Message);
    }

    internal static float[] ReadAll(HindcastFile file, WaveParameter v)
    {
        var values = new float[file.TimesUtc.Count * file.Grid.PointCount];
        file.ReadSteps(v, 0, file.TimesUtc.Count, 0, file.Grid.PointCount, values);
        return values;
    }
}
