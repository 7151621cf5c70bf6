using System.Globalization;
using System.Text.RegularExpressions;
using Atlas.TestSupport;

namespace Atlas.Hindcast.Tests;

public sealed class NetCdfFileTests
{
    private readonly NetCdfFixtures _fixtures = NetCdfFixtures.Shared;

    [Theory]
    [InlineData("classic", NetCdfFormat.Classic)]
    [InlineData("offset64", NetCdfFormat.Offset64)]
    [InlineData("cdf5", NetCdfFormat.Cdf5)]
    [InlineData("nc4", NetCdfFormat.NetCdf4)]
    [InlineData("nc4classic", NetCdfFormat.NetCdf4Classic)]
    public void EveryFormatOpensAndReportsTheFormatNcdumpReports(string kind, NetCdfFormat format)
    {
        string path = _fixtures.Path("regular_float." + kind);
        using var file = NetCdfFile.Open(path);
        Assert.Equal(format, file.Format);
        // Reference: `ncdump -k` prints the kind name ncgen -k was given.
        Assert.Equal(NetCdfFixtures.Kinds[kind], ExternalTool.Run("ncdump", ["-k", path]).Trim());
    }

    [Theory]
    [InlineData("classic")]
    [InlineData("nc4")]
    public void DimensionsVariablesAndAttributesAreThoseTheCdlDefines(string kind)
    {
        using var file = NetCdfFile.Open(_fixtures.Path("regular_float." + kind));
        // Reference: regular_float.cdl as compiled by ncgen.
        Assert.Equal(["time", "latitude", "longitude"], file.Dimensions.Select(d => d.Name));
        Assert.Equal([4L, 3L, 4L], file.Dimensions.Select(d => d.Length));
        Assert.True(file.Dimensions[0].IsUnlimited);
        var hs = file.Variable("hs");
        Assert.Equal(NetCdfType.Float, hs.Type);
        Assert.Equal([4L, 3L, 4L], hs.Shape);
        Assert.Equal("sea_surface_wave_significant_height", hs.TextAttribute("standard_name"));
        Assert.Equal(-999.0, hs.NumberAttribute("_FillValue"));
        Assert.Equal(NetCdfType.Float, hs.Attribute("_FillValue")!.Type);
        Assert.Equal("CF-1.8", file.GlobalAttribute("Conventions")?.Text);
        Assert.Equal(NetCdfType.Double, file.Variable("time").Type);
    }

    [Fact]
    public void NetCdf4VariablesAreChunkedAndCompressedAsNcdumpShows()
    {
        string path = _fixtures.Path("regular_float.nc4");
        using var file = NetCdfFile.Open(path);
        var hs = file.Variable("hs");
        Assert.Equal(NetCdfStorage.Chunked, hs.Storage);
        Assert.Equal([2L, 3L, 2L], hs.ChunkSizes!);
        Assert.Equal(5, hs.DeflateLevel);
        Assert.True(hs.Shuffle);
        // Reference: `ncdump -hs` shows the special storage attributes netCDF-C reports.
        string header = ExternalTool.Run("ncdump", ["-hs", path]);
        Assert.Contains("hs:_ChunkSizes = 2, 3, 2 ;", header);
        Assert.Contains("hs:_DeflateLevel = 5 ;", header);
        Assert.Contains("hs:_Shuffle = \"true\" ;", header);
    }

    [Theory]
    [InlineData("classic")]
    [InlineData("offset64")]
    [InlineData("cdf5")]
    [InlineData("nc4")]
    [InlineData("nc4classic")]
    public void HyperslabReadsMatchNcdumpValues(string kind)
    {
        string path = _fixtures.Path("regular_float." + kind);
        // Reference: the data section of `ncdump -v hs` (exact float text; "_" marks the fill value).
        var dumped = NcdumpValues(path, "hs");
        using var file = NetCdfFile.Open(path);
        var hs = file.Variable("hs");
        var slab = new float[2 * 2 * 3];
        file.Read<float>(hs, [1, 1, 1], [2, 2, 3], slab);
        int k = 0;
        for (int t = 1; t < 3; t++)
            for (int j = 1; j < 3; j++)
                for (int i = 1; i < 4; i++, k++)
                {
                    float expected = dumped[(t * 3 + j) * 4 + i];
                    Assert.Equal(float.IsNaN(expected) ? -999f : expected, slab[k]);
                }
    }

    [Fact]
    public void SlabsConvertToTheRequestedMemoryType()
    {
        using var file = NetCdfFile.Open(_fixtures.Path("packed.classic"));
        var hs = file.Variable("hs");
        var raw = new short[5];
        file.Read<short>(hs, [0, 0, 0], [1, 1, 5], raw);
        // Reference: the stored shorts of packed.cdl, first row.
        Assert.Equal([1000, 1250, -32767, 1750, 2000], raw);
        var asDouble = new double[5];
        file.Read<double>(hs, [0, 0, 0], [1, 1, 5], asDouble);
        Assert.Equal([1000.0, 1250, -32767, 1750, 2000], asDouble);
    }

    [Fact]
    public void ReadOutsideTheVariableIsRefusedBeforeCallingTheLibrary()
    {
        using var file = NetCdfFile.Open(_fixtures.Path("regular_float.classic"));
        var e = Assert.Throws<ArgumentOutOfRangeException>(() => file.Read<float>(file.Variable("hs"), [3, 0, 0], [2, 1, 1], new float[2]));
        Assert.Contains("'time'", e.Message);
    }

    [Theory]
    [InlineData("classic", 10)]
    [InlineData("offset64", 1)]
    [InlineData("cdf5", 100)]
    public void CutClassicFileIsRefusedAsTruncated(string kind, int cutBytes)
    {
        string path = Cut(_fixtures.Path("regular_float." + kind), cutBytes);
        // netCDF-C itself opens such a file and reads the lost tail as zeros (seen with ncdump), so the size check is ours.
        var e = Assert.Throws<HindcastFormatException>(() => NetCdfFile.Open(path));
        Assert.Equal(path, e.File);
        Assert.Null(e.Variable);
        Assert.StartsWith("truncated", e.Problem);
        Assert.Throws<HindcastFormatException>(() => HindcastFile.Open(path));
    }

    [Theory]
    [InlineData("classic")]
    [InlineData("offset64")]
    public void AnAttributeWhoseHeaderClaimsMoreValuesThanTheFileHoldsIsRefusedBeforeItIsRead(string kind)
    {
        // Found by the ingest fuzz test: a flipped bit in a classic header's attribute count made the library fill
        // gigabytes for a file of kilobytes. The classic header stores the global attribute :title as name length,
        // name padded to 4 bytes, type, value count (big-endian, 4 bytes), values (the netCDF classic format spec);
        // raising the count's first byte makes it claim 268 million values. (CDF5's 8-byte counts, raised alike, make
        // nc_open itself fail to allocate them.)
        var source = _fixtures.Path("regular_float." + kind);
        var bytes = File.ReadAllBytes(source);
        var name = System.Text.Encoding.ASCII.GetBytes("title");
        var at = bytes.AsSpan().IndexOf(name);
        Assert.True(at > 0, "no :title attribute in the fixture header");
        bytes[at + 8 + 4] = 0x10;
        var path = _fixtures.Scratch("huge-attribute-" + System.IO.Path.GetFileName(source));
        File.WriteAllBytes(path, bytes);
        var e = Assert.ThrowsAny<Exception>(() => NetCdfFile.Open(path));
        Assert.Contains(path, e.Message);
        // Refused by the project's own header walk, before nc_open could allocate for it.
        Assert.True(e is HindcastFormatException { Problem: var p } && p.StartsWith("truncated or damaged: the header runs past"), e.ToString());
    }

    [Fact]
    public void ATextAttributeEndsAtItsFirstNulCharacter()
    {
        // Found by the ingest fuzz test: a NUL inside :title reached PostgreSQL's jsonb, which refuses it.
        var bytes = File.ReadAllBytes(_fixtures.Path("regular_float.classic"));
        var at = bytes.AsSpan().IndexOf("invented test grid"u8);
        bytes[at + "invented".Length] = 0;
        var path = _fixtures.Scratch("nul-in-title.nc");
        File.WriteAllBytes(path, bytes);
        using var file = NetCdfFile.Open(path);
        Assert.Equal("invented", file.GlobalAttribute("title")!.Text);
    }

    [Fact]
    public void CutNetCdf4FileIsRefusedWithTheLibraryError()
    {
        string path = Cut(_fixtures.Path("compressed"), 4096);
        var e = Assert.Throws<NetCdfException>(() => HindcastFile.Open(path));
        Assert.Equal("nc_open", e.Operation);
        Assert.StartsWith(path + ": nc_open failed: NetCDF: ", e.Message);
        Assert.True(e.Status < 0);
    }

    [Fact]
    public void GarbageFileIsRefusedAsAnUnknownFormat()
    {
        string path = _fixtures.Scratch("garbage.nc");
        var bytes = new byte[2000];
        new Random(5).NextBytes(bytes);
        File.WriteAllBytes(path, bytes);
        var e = Assert.Throws<NetCdfException>(() => HindcastFile.Open(path));
        // nc_strerror text for NC_ENOTNC, as ncdump prints it for the same file.
        Assert.Contains("Unknown file format", e.Message);
        Assert.Contains("Unknown file format", ExternalTool.Output("ncdump", [path]));
    }

    [Fact]
    public void LibraryVersionIsTheOneNcdumpReports()
    {
        // Reference: the last line of `ncdump` usage text, "netcdf library version 4.9.0 of ...".
        string usage = ExternalTool.Output("ncdump", []);
        string version = NetCdfFile.LibraryVersion.Split(' ')[0];
        Assert.Contains($"netcdf library version {version}", usage);
    }

    [Fact]
    public void MissingFileIsAFileNotFoundError()
    {
        string path = _fixtures.Scratch("absent.nc");
        Assert.Throws<FileNotFoundException>(() => NetCdfFile.Open(path));
    }

    private string Cut(string source, int bytes)
    {
        string path = _fixtures.Scratch("cut-" + System.IO.Path.GetFileName(source));
        var all = File.ReadAllBytes(source);
        File.WriteAllBytes(path, all[..^bytes]);
        return path;
    }

    /// <summary>The values of one variable from `ncdump -v`, "_" as NaN.</summary>
    internal static float[] NcdumpValues(string path, string variable)
    {
        string text = ExternalTool.Run("ncdump", ["-v", variable, "-p", "9,17", path]);
        string data = text[text.IndexOf("data:", StringComparison.Ordinal)..];
        var match = Regex.Match(data, $@"\b{variable} =(?<values>[^;]*);");
        return match.Groups["values"].Value.Split(',', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries)
            .Select(v => v == "_" ? float.NaN : float.Parse(v, CultureInfo.InvariantCulture)).ToArray();
    }
}
