using System.Globalization;
using System.Text.Json;
using Atlas.TestSupport;

namespace Atlas.Hindcast.Tests;

public sealed class HindcastWriterTests
{
    private readonly NetCdfFixtures _fixtures = NetCdfFixtures.Shared;

    private static readonly double[] Latitudes = [50.0, 50.5];
    private static readonly double[] Longitudes = [-6.0, -5.5, -5.0];
    private static readonly DateTime Origin = new(2001, 1, 1, 0, 0, 0, DateTimeKind.Utc);

    [Fact]
    public void WrittenHindcastCarriesCfAttributesAsNcdumpShowsThem()
    {
        string path = WriteHindcast(NetCdfFormat.NetCdf4, unlimited: true);
        // Reference: `ncdump -hs` (netCDF-C's own reading of the header, with storage attributes).
        string header = ExternalTool.Run("ncdump", ["-hs", path]);
        foreach (var line in new[]
                 {
                     "time = UNLIMITED ; // (3 currently)",
                     "latitude = 2 ;",
                     "longitude = 3 ;",
                     "time:units = \"hours since 2001-01-01 00:00:00\" ;",
                     "time:calendar = \"standard\" ;",
                     "latitude:units = \"degrees_north\" ;",
                     "longitude:standard_name = \"longitude\" ;",
                     "float hs(time, latitude, longitude) ;",
                     "hs:standard_name = \"sea_surface_wave_significant_height\" ;",
                     "hs:long_name = \"significant wave height\" ;",
                     "hs:units = \"m\" ;",
                     "hs:_FillValue = -999.f ;",
                     "hs:grid_mapping = \"crs\" ;",
                     "hs:cell_methods = \"time: point\" ;",
                     "hs:_ChunkSizes = 1, 2, 3 ;",
                     "hs:_DeflateLevel = 4 ;",
                     "hs:_Shuffle = \"true\" ;",
                     "float depth(latitude, longitude) ;",
                     "crs:grid_mapping_name = \"latitude_longitude\" ;",
                     ":Conventions = \"CF-1.8\" ;",
                     ":title = \"invented round-trip test\" ;",
                     ":institution = \"test institution\" ;",
                     ":source = \"HindcastWriterTests\" ;",
                     ":history = \"written by the test\" ;",
                     ":comment = \"values are invented\" ;",
                     ":caution = \"not a design basis\" ;",
                     ":_Format = \"netCDF-4\" ;",
                 })
            Assert.Contains(line, header);
    }

    [Theory]
    [InlineData(NetCdfFormat.NetCdf4, true)]
    [InlineData(NetCdfFormat.Classic, false)]
    public void WrittenValuesReadBackEqualInNetCdf4Python(NetCdfFormat format, bool unlimited)
    {
        string path = WriteHindcast(format, unlimited);
        // Reference: netCDF4-python with auto masking (fill -> null) and cftime dates.
        using var doc = JsonDocument.Parse(ExternalTool.Run(ExternalTool.Python, [NetCdfFixtures.Source("read_back.py"), path]));
        var back = doc.RootElement.GetProperty(path);
        Assert.Equal(format == NetCdfFormat.NetCdf4 ? "NETCDF4" : "NETCDF3_CLASSIC", back.GetProperty("data_model").GetString());
        var variables = back.GetProperty("variables");
        Assert.Equal(Hs(), NetCdfFixtures.Values(variables.GetProperty("hs")));
        Assert.Equal(Depth(), NetCdfFixtures.Values(variables.GetProperty("depth")));
        Assert.Equal(Latitudes.Select(v => (float)v), NetCdfFixtures.Values(variables.GetProperty("latitude")));
        Assert.Equal(Longitudes.Select(v => (float)v), NetCdfFixtures.Values(variables.GetProperty("longitude")));
        var times = back.GetProperty("times").EnumerateArray().Select(t => DateTime.Parse(t.GetString()!, CultureInfo.InvariantCulture,
            DateTimeStyles.AdjustToUniversal | DateTimeStyles.AssumeUniversal));
        Assert.Equal(Times(), times);
    }

    [Fact]
    public void WrittenHindcastReadsBackThroughHindcastFile()
    {
        string path = WriteHindcast(NetCdfFormat.NetCdf4, unlimited: true);
        using var file = HindcastFile.Open(path);
        var grid = Assert.IsType<RegularLatLonGrid>(file.Grid);
        Assert.Equal(Latitudes, grid.LatitudeAxis);
        Assert.Equal(Longitudes, grid.LongitudeAxis);
        Assert.Equal(Times(), file.TimesUtc);
        Assert.Equal(Hs(), HindcastFileTests.ReadAll(file, WaveParameter.Hs));
        Assert.Equal(Depth(), file.ReadDepth());
    }

    [Fact]
    public void LayerFileHoldsOneStaticFieldAndNoTime()
    {
        string path = _fixtures.Scratch("layer.nc");
        float[] values = [10.5f, float.NaN, 12f, 13.25f, 14f, 15f];
        HindcastWriter.WriteLayer(path, Options() with { Comment = "annual mean wave power" },
            new CfField("j_mean", "kW m-1") { LongName = "mean omnidirectional wave power", Attributes = new Dictionary<string, string> { ["cell_methods"] = "time: mean" } },
            values);
        string header = ExternalTool.Run("ncdump", ["-h", path]);
        Assert.DoesNotContain("time", header.Replace("cell_methods = \"time: mean\"", ""));
        Assert.Contains("float j_mean(latitude, longitude) ;", header);
        Assert.Contains("j_mean:units = \"kW m-1\" ;", header);
        Assert.Contains(":comment = \"annual mean wave power\" ;", header);
        using var doc = JsonDocument.Parse(ExternalTool.Run(ExternalTool.Python, [NetCdfFixtures.Source("read_back.py"), path]));
        Assert.Equal(values, NetCdfFixtures.Values(doc.RootElement.GetProperty(path).GetProperty("variables").GetProperty("j_mean")));
    }

    [Fact]
    public void MisuseOfTheWriterIsRefused()
    {
        string path = _fixtures.Scratch("misuse.nc");
        Assert.Throws<ArgumentException>(() => HindcastWriter.Create(path, Options() with { Longitudes = [1.0, 0.5] }));
        using var writer = HindcastWriter.Create(path, Options() with { Time = null });
        Assert.Throws<InvalidOperationException>(() => writer.DefineField(new CfField("hs", "m")));
        writer.DefineField(new CfField("depth", "m") { HasTime = false });
        Assert.Throws<ArgumentException>(() => writer.WriteField("depth", new float[5]));
        Assert.Throws<InvalidOperationException>(() => writer.WriteTimes(0, [Origin]));
    }

    private string WriteHindcast(NetCdfFormat format, bool unlimited)
    {
        string path = _fixtures.Scratch("hindcast.nc");
        using var writer = HindcastWriter.Create(path, Options() with
        {
            Format = format,
            Time = new CfTimeAxis(Origin, CfTimeUnit.Hours, unlimited ? null : 3),
        });
        writer.DefineField(new CfField("hs", "m")
        {
            StandardName = CfStandardNames.SignificantHeight,
            LongName = "significant wave height",
            FillValue = -999f,
            Attributes = new Dictionary<string, string> { ["cell_methods"] = "time: point" },
        });
        writer.DefineField(new CfField("te", "s") { StandardName = CfStandardNames.EnergyPeriod, LongName = "energy period" });
        writer.DefineField(new CfField("depth", "m") { StandardName = "sea_floor_depth_below_sea_surface", HasTime = false, DeflateLevel = 0, Shuffle = false });
        writer.WriteTimes(0, Times());
        var hs = Hs();
        writer.WriteSteps("hs", 0, 2, hs.AsSpan(0, 12));
        writer.WriteSteps("hs", 2, 1, hs.AsSpan(12, 6));
        writer.WriteSteps("te", 0, 3, hs.Select(h => float.IsNaN(h) ? h : 5 + h).ToArray());
        writer.WriteField("depth", Depth());
        writer.Close();
        return path;
    }

    private static HindcastWriterOptions Options() => new()
    {
        Latitudes = Latitudes,
        Longitudes = Longitudes,
        Title = "invented round-trip test",
        Institution = "test institution",
        Source = "HindcastWriterTests",
        History = "written by the test",
        Comment = "values are invented",
        GlobalAttributes = new Dictionary<string, string> { ["caution"] = "not a design basis" },
    };

    private static DateTime[] Times() => [Origin, Origin.AddHours(1), Origin.AddHours(2.5)];

    private static float[] Hs() => Enumerable.Range(0, 18).Select(k => k == 4 ? float.NaN : 0.5f + 0.125f * k).ToArray();

    private static float[] Depth() => [float.NaN, 12f, 20.5f, 8f, 40f, 55f];
}
