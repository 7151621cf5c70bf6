using System.Net.Http.Headers;
using System.Net;
using Atlas.Api.Tests.Support;
using Atlas.TestSupport;

namespace Atlas.Api.Tests.Assessment;

/// <summary>
/// The HTTP upload takes what <c>atlas stations add</c> takes, through the same loader: a CF-NetCDF point time series
/// (written by netCDF4-python with tests/data/assessment/make_station_netcdf.py, a writer the project did
/// not write) as well as CSV, with the same checks.
/// </summary>
[Collection(AtlasApiCollection.Name)]
public sealed class StationUploadFormatTests(AtlasApiFixture atlas)
{
    private static byte[] StationNetCdf(string testCase)
    {
        var path = StationNetCdfFiles.Write(Path.Combine(Path.GetTempPath(), $"atlas-api-station-{testCase}-{Guid.NewGuid():N}.nc"), testCase);
        try { return File.ReadAllBytes(path); }
        finally { File.Delete(path); }
    }

    private static MultipartFormDataContent Form(string name, byte[] file, string fileName)
    {
        var form = new MultipartFormDataContent
        {
            { new StringContent(name), "name" },
            { new StringContent("invented test buoy"), "instrument" },
            { new StringContent("validation"), "role" },
        };
        var part = new ByteArrayContent(file);
        part.Headers.ContentType = new MediaTypeHeaderValue("application/x-netcdf");
        form.Add(part, "file", fileName);
        return form;
    }

    [Fact]
    public async Task ACfNetCdfRecordUploadedWithoutAPositionTakesTheFilesPosition()
    {
        var writer = AssessmentAtlas.Writer(atlas);
        var response = await writer.PostAsync("/api/v1/stations", Form("Netcdf Upload Buoy", StationNetCdf("good"), "buoy.nc"));
        Assert.Equal(HttpStatusCode.Created, response.StatusCode);
        var station = (await AssessmentAtlas.JsonAsync(response)).GetProperty("station");
        // make_station_netcdf.py states 51.25 N, 334.5 E (that is -25.5 E).
        Assert.Equal(51.25, station.GetProperty("lat").GetDouble(), 9);
        Assert.Equal(-25.5, station.GetProperty("lon").GetDouble(), 9);
        Assert.Equal("netcdf", station.GetProperty("source_format").GetString());
        Assert.Equal("buoy.nc", station.GetProperty("source_file").GetString());
        Assert.Equal(HttpStatusCode.NoContent, (await writer.DeleteAsync("/api/v1/stations/netcdf-upload-buoy")).StatusCode);
    }

    [Fact]
    public async Task ABadCfNetCdfRecordIsRefusedByVariableAndIndexAndStoresNothing()
    {
        var problem = await Problems.AssertAsync(
            await AssessmentAtlas.Writer(atlas).PostAsync("/api/v1/stations", Form("Negative Netcdf Buoy", StationNetCdf("negative_hs"), "negative.nc")),
            HttpStatusCode.BadRequest);
        Assert.Contains("nothing was stored", problem.GetProperty("title").GetString());
        Assert.Contains(problem.GetProperty("errors").GetProperty("file").EnumerateArray(), e => e.GetString()!.Contains("is negative", StringComparison.Ordinal));
        await Problems.AssertAsync(await atlas.Factory.CreateClient().GetAsync("/api/v1/stations/negative-netcdf-buoy"), HttpStatusCode.NotFound);
    }
}
