using System.Globalization;
using System.Net.Http.Headers;
using System.Net;
using System.Text.Json;
using Atlas.Api.Model;
using Atlas.Api.Tests.Support;
using Atlas.Storage.Statistics;
using Microsoft.Data.Analysis;
using Atlas.TestSupport;

namespace Atlas.Api.Tests;

[Collection(AtlasApiCollection.Name)]
public sealed class LayerApiTests(AtlasApiFixture atlas)
{
    private readonly HttpClient _client = atlas.Factory.CreateClient();
    private static readonly string Coast = $"/api/v1/datasets/{SyntheticAtlas.CoastSlug}/layers";
    private static readonly string Mesh = $"/api/v1/datasets/{SyntheticAtlas.MeshSlug}/layers";

    private async Task<string> DownloadAsync(string url, string extension)
    {
        var path = ExternalTool.TempFile(extension);
        await File.WriteAllBytesAsync(path, await _client.GetByteArrayAsync(url));
        return path;
    }

    private async Task<Dictionary<int, LayerValue>> StoredLayerAsync(WaveParameter parameter, AtlasPeriod period, StatisticKind statistic)
    {
        var dataset = (await new Atlas.Storage.Datasets.DatasetStore(atlas.DataSource).FindAsync(SyntheticAtlas.CoastSlug))!;
        // Positions joined in by the database: the API takes them from its in-memory cell table, so the two paths meet here.
        return (await new StatisticsStore(atlas.DataSource).LayerAsync(dataset.Id, parameter, period, statistic, cellOf: null))
            .ToDictionary(v => v.CellId);
    }

    private static string Inv(double v) => v.ToString("R", CultureInfo.InvariantCulture);

    [Fact]
    public async Task CatalogueListsTheStoredParameterPeriodCombinations()
    {
        var root = JsonDocument.Parse(await _client.GetStringAsync(Coast)).RootElement;
        var hs = root.GetProperty("parameters").EnumerateArray().Single(p => p.GetProperty("symbol").GetString() == "hs");
        var periods = hs.GetProperty("periods").EnumerateArray().Select(p => p.GetString()!).ToArray();
        Assert.Equal(new[] { "jan", "feb", "mar", "apr", "may", "jun", "jul", "aug", "sep", "oct", "nov", "dec", "djf", "mam", "jja", "son", "annual", "y2019", "y2020" }, periods);
        Assert.Equal("m", hs.GetProperty("units").GetString());
        Assert.Equal(0.01, hs.GetProperty("percentile_bin_width").GetDouble());
        Assert.Contains(root.GetProperty("parameters").EnumerateArray(), p => p.GetProperty("symbol").GetString() == "dir");
        Assert.Contains("tif", root.GetProperty("formats").EnumerateArray().Select(f => f.GetString()));
    }

    [Fact]
    public async Task GeoTiffReadsBackWithGdalWithExtentCrsNodataAndValues()
    {
        var path = await DownloadAsync($"{Coast}/hs/mean/annual.tif", ".tif");
        try
        {
            var info = JsonDocument.Parse(ExternalTool.Run("gdalinfo", "-json", "-mdd", "all", path)).RootElement;
            Assert.Equal([SyntheticAtlas.Nx, SyntheticAtlas.Ny], info.GetProperty("size").EnumerateArray().Select(v => v.GetInt32()));
            // Pixel-is-area: the raster reaches half a cell beyond the outer cell centres (GDAL geotransform order).
            var transform = info.GetProperty("geoTransform").EnumerateArray().Select(v => v.GetDouble()).ToArray();
            Assert.Equal(SyntheticAtlas.West - 0.05, transform[0], 9);
            Assert.Equal(0.1, transform[1], 9);
            Assert.Equal(SyntheticAtlas.Latitude(SyntheticAtlas.Ny - 1) + 0.05, transform[3], 9);
            Assert.Equal(-0.1, transform[5], 9);
            Assert.Contains("\"EPSG\",4326", info.GetProperty("coordinateSystem").GetProperty("wkt").GetString()!.Replace(" ", ""));
            var band = info.GetProperty("bands")[0];
            Assert.Equal("Float32", band.GetProperty("type").GetString());
            Assert.Equal(-9999, band.GetProperty("noDataValue").GetDouble());
            Assert.Equal("m", band.GetProperty("unit").GetString());
            Assert.Equal(AtlasCaution.Text, info.GetProperty("metadata").GetProperty("").GetProperty("caution").GetString());
            Assert.Equal("COG", info.GetProperty("metadata").GetProperty("IMAGE_STRUCTURE").GetProperty("LAYOUT").GetString());

            var stored = await StoredLayerAsync(WaveParameter.Hs, AtlasPeriod.Annual, StatisticKind.Mean);
            foreach (var (i, j) in new[] { (0, 0), (5, 4), (9, 9), (3, 7) })
            {
                var value = ExternalTool.Run("gdallocationinfo", "-valonly", "-wgs84", path, Inv(SyntheticAtlas.Longitude(i)), Inv(SyntheticAtlas.Latitude(j)));
                Assert.Equal(stored[SyntheticAtlas.CellId(i, j)].Value, double.Parse(value, CultureInfo.InvariantCulture), 1e-6);
            }
            var land = ExternalTool.Run("gdallocationinfo", "-valonly", "-wgs84", path, Inv(SyntheticAtlas.Longitude(11)), Inv(SyntheticAtlas.Latitude(5)));
            Assert.Equal(-9999, double.Parse(land, CultureInfo.InvariantCulture));
        }
        finally { File.Delete(path); }
    }

    [Fact]
    public async Task MeshLayerIsAValidCloudOptimisedGeoTiffWithOverviewsAndLinearlyInterpolatedValues()
    {
        var path = await DownloadAsync($"{Mesh}/hs/mean/annual.tif", ".tif");
        try
        {
            // GDAL's own validator (python3-gdal), with the full check of the tile leaders and trailers.
            var verdict = ExternalTool.Run(ExternalTool.Python, "-m", "osgeo_utils.samples.validate_cloud_optimized_geotiff", "--full-check=yes", path);
            Assert.Contains("is a valid cloud optimized GeoTIFF", verdict);
            var info = JsonDocument.Parse(ExternalTool.Run("gdalinfo", "-json", path)).RootElement;
            var band = info.GetProperty("bands")[0];
            Assert.Equal([256, 256], band.GetProperty("block").EnumerateArray().Select(v => v.GetInt32()));
            Assert.True(band.GetProperty("overviews").GetArrayLength() >= 1);
            Assert.True(info.GetProperty("size")[0].GetInt32() > 256);
            // The mesh holds a linear field, which linear interpolation on triangles reproduces exactly (float32: 1e-4 m).
            foreach (var (lon, lat) in new[] { (30.1231, 10.4567), (30.5013, 10.2509), (30.7777, 10.7111) })
            {
                var value = ExternalTool.Run("gdallocationinfo", "-valonly", "-wgs84", path, Inv(lon), Inv(lat));
                var pixel = info.GetProperty("geoTransform").EnumerateArray().Select(v => v.GetDouble()).ToArray();
                // The value is that of the pixel centre containing the position.
                var cx = pixel[0] + (Math.Floor((lon - pixel[0]) / pixel[1]) + 0.5) * pixel[1];
                var cy = pixel[3] + (Math.Floor((lat - pixel[3]) / pixel[5]) + 0.5) * pixel[5];
                Assert.Equal(SyntheticAtlas.MeshHs(cx, cy), double.Parse(value, CultureInfo.InvariantCulture), 1e-4);
            }
        }
        finally { File.Delete(path); }
    }

    [Fact]
    public async Task CsvLayerLoadsAsADataFrameWithTheStoredValues()
    {
        // GDAL, pandas and the CSVW structure: see CsvDownloadCheck.
        var download = await CsvDownloadCheck.AssertAsync(_client, $"{Coast}/j/p90/djf.csv");
        Assert.Equal(["cell_id", "lon", "lat", "value"], download.Header);
        Assert.Contains(AtlasCaution.Text, CsvDownloadCheck.Notes(download.Metadata));
        Assert.Equal("kW/m", CsvDownloadCheck.Unit(download.Metadata, "value"));
        Assert.EndsWith("/j/p90/djf.csv-metadata.json", download.MetadataUrl);
        using var stream = new MemoryStream(System.Text.Encoding.UTF8.GetBytes(download.Csv));
        var frame = DataFrame.LoadCsv(stream);
        var stored = await StoredLayerAsync(WaveParameter.J, AtlasPeriod.Djf, StatisticKind.P90);
        Assert.Equal(stored.Count, frame.Rows.Count);
        for (var r = 0; r < frame.Rows.Count; r++)
        {
            var id = Convert.ToInt32(frame["cell_id"][r], CultureInfo.InvariantCulture);
            Assert.Equal((float)stored[id].Value, Convert.ToSingle(frame["value"][r], CultureInfo.InvariantCulture));
            Assert.Equal(stored[id].Longitude, Convert.ToDouble(frame["lon"][r], CultureInfo.InvariantCulture), 5);
        }
    }

    [Fact]
    public async Task GeoJsonPolygonsAreCellFootprintsWithSpheroidAreasAndProvenance()
    {
        var root = JsonDocument.Parse(await _client.GetStringAsync($"{Coast}/hs/mean/annual.geojson?geometry=polygon")).RootElement;
        Assert.Equal("FeatureCollection", root.GetProperty("type").GetString());
        Assert.Equal(AtlasCaution.Text, root.GetProperty("provenance").GetProperty("caution").GetString());
        var features = root.GetProperty("features").EnumerateArray().ToArray();
        Assert.Equal(100, features.Length);
        var feature = features.Single(f => f.GetProperty("id").GetInt32() == SyntheticAtlas.CellId(4, 6));
        Assert.Equal("Polygon", feature.GetProperty("geometry").GetProperty("type").GetString());
        // PostGIS: the area of the same 0.1 x 0.1 degree cell on the WGS 84 spheroid (geodesic edges; 1e-4 relative).
        await using var command = atlas.DataSource.CreateCommand("SELECT ST_Area(ST_MakeEnvelope(20.35, 40.55, 20.45, 40.65, 4326)::geography, true) / 1e6");
        var postgis = (double)(await command.ExecuteScalarAsync())!;
        Assert.Equal(postgis, feature.GetProperty("properties").GetProperty("area_km2").GetDouble(), postgis * 1e-4);
        var points = JsonDocument.Parse(await _client.GetStringAsync($"{Coast}/hs/mean/annual.geojson")).RootElement;
        Assert.Equal("Point", points.GetProperty("features")[0].GetProperty("geometry").GetProperty("type").GetString());
        // RFC 7946 section 3.1.6: exterior rings are counter-clockwise (a positive shoelace area).
        foreach (var f in features) Assert.True(SignedArea(f.GetProperty("geometry").GetProperty("coordinates")[0]) > 0);
        // GDAL's GeoJSON driver (ogrinfo) reads the download as 100 polygons.
        var path = await DownloadAsync($"{Coast}/hs/mean/annual.geojson?geometry=polygon", ".geojson");
        try
        {
            var info = ExternalTool.Run("ogrinfo", "-ro", "-so", "-al", path);
            Assert.Contains("Feature Count: 100", info);
            Assert.Contains("Geometry: Polygon", info);
        }
        finally { File.Delete(path); }
    }

    /// <summary>Twice the signed area of a closed ring of [lon, lat] positions (shoelace formula): positive when counter-clockwise.</summary>
    internal static double SignedArea(JsonElement ring)
    {
        var p = ring.EnumerateArray().Select(c => (X: c[0].GetDouble(), Y: c[1].GetDouble())).ToArray();
        var sum = 0.0;
        for (var i = 0; i + 1 < p.Length; i++) sum += p[i].X * p[i + 1].Y - p[i + 1].X * p[i].Y;
        return sum;
    }

    [Fact]
    public async Task NetCdfLayerIsCfWithProvenanceAndTheStoredValues()
    {
        var path = await DownloadAsync($"{Coast}/te/mean/jja.nc", ".nc");
        try
        {
            var header = ExternalTool.Run("ncdump", "-h", path);
            Assert.Contains("te_mean(latitude, longitude)", header);
            Assert.Contains(AtlasCaution.Text, header);
            Assert.Contains("CF-1.8", header);
            // netCDF4-python reads the value at cell (4, 6): row 3 from the north, column 4.
            var value = ExternalTool.Run(ExternalTool.Python, "-c",
                $"import netCDF4; d = netCDF4.Dataset('{path}'); v = d['te_mean']; i = list(d['latitude'][:]).index(min(d['latitude'][:], key=lambda x: abs(x - 40.6))); " +
                "j = list(d['longitude'][:]).index(min(d['longitude'][:], key=lambda x: abs(x - 20.4))); print(repr(float(v[i, j])))");
            var stored = await StoredLayerAsync(WaveParameter.Te, AtlasPeriod.Jja, StatisticKind.Mean);
            Assert.Equal((float)stored[SyntheticAtlas.CellId(4, 6)].Value, float.Parse(value, CultureInfo.InvariantCulture));
        }
        finally { File.Delete(path); }
    }

    [Fact]
    public async Task PngFigureIsAPictureWithRoomForItsCaption()
    {
        var bytes = await _client.GetByteArrayAsync($"{Mesh}/hs/mean/annual.png");
        Assert.Equal(new byte[] { 0x89, (byte)'P', (byte)'N', (byte)'G' }, bytes[..4]);
        using var image = SkiaSharp.SKBitmap.Decode(bytes);
        Assert.True(image.Width > 700 && image.Height > image.Width / 2, $"{image.Width} x {image.Height}");
    }

    [Fact]
    public async Task DownloadsCarryAnETagAndAnswerNotModified()
    {
        var url = $"{Coast}/j/mean/annual.tif";
        var first = await _client.GetAsync(url);
        Assert.Equal(HttpStatusCode.OK, first.StatusCode);
        Assert.NotNull(first.Headers.ETag);
        Assert.True(first.Headers.CacheControl?.Public);
        Assert.True(first.Headers.CacheControl?.MaxAge > TimeSpan.Zero);
        using var again = new HttpRequestMessage(HttpMethod.Get, url);
        again.Headers.IfNoneMatch.Add(first.Headers.ETag!);
        var second = await _client.SendAsync(again);
        Assert.Equal(HttpStatusCode.NotModified, second.StatusCode);
        Assert.Equal(1, await atlas.CountAsync("SELECT count(*) FROM layer_cache WHERE cache_key LIKE 'j/mean/annual.tif@%'"));
        // A Cloud Optimised GeoTIFF is read by range requests: the 8-byte TIFF header (RFC 9110 partial content).
        using var range = new HttpRequestMessage(HttpMethod.Get, url);
        range.Headers.Range = new RangeHeaderValue(0, 7);
        var partial = await _client.SendAsync(range);
        Assert.Equal(HttpStatusCode.PartialContent, partial.StatusCode);
        Assert.Equal(new byte[] { (byte)'I', (byte)'I', 42, 0 }, (await partial.Content.ReadAsByteArrayAsync())[..4]);
    }

    [Theory]
    [InlineData("hz/mean/annual.tif", "parameter")]
    [InlineData("hs/average/annual.tif", "statistic")]
    [InlineData("hs/mean/winter.tif", "period")]
    [InlineData("hs/mean/annual.jpeg", "format")]
    [InlineData("dir/p90/annual.tif", "layers are")]
    [InlineData("hs/mean/y1999.csv", "has no mean of hs for y1999")]
    public async Task UnknownLayerPartsAreNotFoundProblemsListingWhatExists(string path, string detail)
    {
        await Problems.AssertAsync(await _client.GetAsync($"{Coast}/{path}"), HttpStatusCode.NotFound, detail);
    }

    [Fact]
    public async Task GeometryOptionIsCheckedAndUnknownDatasetHasNoLayers()
    {
        await Problems.AssertAsync(await _client.GetAsync($"{Coast}/hs/mean/annual.geojson?geometry=hexagon"), HttpStatusCode.BadRequest, "polygon");
        await Problems.AssertAsync(await _client.GetAsync($"{Coast}/hs/mean/annual.csv?geometry=polygon"), HttpStatusCode.BadRequest, "geojson");
        await Problems.AssertAsync(await _client.GetAsync("/api/v1/datasets/elsewhere/layers"), HttpStatusCode.NotFound);
    }
}
