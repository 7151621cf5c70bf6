using System.Diagnostics;
using System.Text;
using System.Text.Json;
using Microsoft.Playwright;

namespace Atlas.Browser.Tests;

[Collection(AtlasSiteCollection.Name)]
public class DownloadTests(AtlasSite site)
{
    [Fact]
    public async Task EveryLayerDownloadLinkReturnsAValidFile()
    {
        await using var session = await site.OpenAsync();
        var page = session.Page;
        await page.SelectOptionAsync("#layer-parameter", "hs");
        await ShownLayer.WaitForParameterAsync(page, "hs");
        var cells = (await SeaCells.LayerAsync(site.Http, "hs", "mean", "annual")).Count;
        var links = page.Locator("#layer-downloads a");
        Assert.Equal(6, await links.CountAsync());
        var folder = Directory.CreateTempSubdirectory("atlas-downloads-").FullName;
        try
        {
            for (var k = 0; k < 6; k++)
            {
                var link = links.Nth(k);
                var format = (await link.GetAttributeAsync("data-format"))!;
                var response = await page.APIRequest.GetAsync((await link.GetAttributeAsync("href"))!);
                Assert.Equal(200, response.Status);
                var body = await response.BodyAsync();
                var type = response.Headers["content-type"];
                // A click saves the file (the server's Content-Disposition name wins over the link's download name).
                var download = await page.RunAndWaitForDownloadAsync(() => link.ClickAsync());
                Assert.EndsWith($"hs_mean_annual.{format}", download.SuggestedFilename);
                var path = Path.Combine(folder, download.SuggestedFilename);
                await download.SaveAsAsync(path);
                Assert.Equal(body, await File.ReadAllBytesAsync(path));

                switch (format)
                {
                    case "tif":
                        Assert.StartsWith("image/tiff", type);
                        // TIFF 6.0 header: byte order "II" then 42 (little-endian), or BigTIFF's 43.
                        Assert.Equal((byte)'I', body[0]);
                        Assert.Equal((byte)'I', body[1]);
                        Assert.Contains(body[2], new byte[] { 42, 43 });
                        CheckWithGdal(path);
                        break;
                    case "csv":
                        Assert.StartsWith("text/csv", type);
                        // RFC 4180: the header first, CRLF line ends, no comment lines.
                        var lines = Encoding.UTF8.GetString(body).Split("\r\n", StringSplitOptions.RemoveEmptyEntries);
                        Assert.DoesNotContain(lines, l => l.StartsWith('#'));
                        Assert.Equal("cell_id,lon,lat,value", lines[0]);
                        Assert.Equal(cells, lines.Length - 1);
                        break;
                    case "geojson":
                        Assert.StartsWith("application/geo+json", type);
                        using (var json = JsonDocument.Parse(body))
                        {
                            Assert.Equal("FeatureCollection", json.RootElement.GetProperty("type").GetString());
                            Assert.Equal(cells, json.RootElement.GetProperty("features").GetArrayLength());
                            Assert.Contains("not a design basis", json.RootElement.GetProperty("caution").GetString());
                        }
                        break;
                    case "nc":
                        Assert.StartsWith("application/x-netcdf", type);
                        // NetCDF-4 is HDF5: the 8-byte signature \x89HDF\r\n\x1a\n (HDF5 file format specification).
                        Assert.Equal(new byte[] { 0x89, (byte)'H', (byte)'D', (byte)'F', 0x0d, 0x0a, 0x1a, 0x0a }, body[..8]);
                        CheckWithNcdump(path);
                        break;
                    case "png":
                        Assert.StartsWith("image/png", type);
                        // PNG signature (RFC 2083, section 3.1).
                        Assert.Equal(new byte[] { 0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a }, body[..8]);
                        break;
                    case "svg":
                        Assert.StartsWith("image/svg+xml", type);
                        // An SVG document: XML whose root is svg in the SVG namespace (SVG 1.1, section 5.1.2).
                        var root = System.Xml.Linq.XDocument.Parse(Encoding.UTF8.GetString(body)).Root!;
                        Assert.Equal(System.Xml.Linq.XName.Get("svg", "http://www.w3.org/2000/svg"), root.Name);
                        break;
                    default:
                        Assert.Fail($"unexpected format {format}");
                        break;
                }
            }
        }
        finally
        {
            Directory.Delete(folder, recursive: true);
        }
        Assert.Empty(session.Errors);
    }

    // GDAL (gdal-bin) reads the download as a GeoTIFF in EPSG:4326: an outside reader, not the project's writer.
    private static void CheckWithGdal(string path)
    {
        var output = Run("gdalinfo", $"-json \"{path}\"");
        using var info = JsonDocument.Parse(output);
        Assert.Equal("GTiff", info.RootElement.GetProperty("driverShortName").GetString());
        Assert.Contains("4326", info.RootElement.GetProperty("coordinateSystem").GetProperty("wkt").GetString());
    }

    // ncdump (netcdf-bin) reads the header of the NetCDF download.
    private static void CheckWithNcdump(string path)
    {
        var header = Run("ncdump", $"-h \"{path}\"");
        Assert.Contains("hs", header);
        Assert.Contains("Conventions", header);
    }

    private static string Run(string tool, string arguments)
    {
        using var process = Process.Start(new ProcessStartInfo(tool, arguments)
        {
            RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false,
        }) ?? throw new InvalidOperationException($"{tool} did not start");
        var output = process.StandardOutput.ReadToEnd();
        var error = process.StandardError.ReadToEnd();
        process.WaitForExit();
        Assert.True(process.ExitCode == 0, $"{tool} {arguments} failed: {error}");
        return output;
    }
}
