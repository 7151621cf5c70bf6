using System.Globalization;
using System.Net;
using System.Text;
using System.Text.Json;
using Atlas.Api.Tests.Support;

namespace Atlas.Api.Tests;

[Collection(AtlasApiCollection.Name)]
public sealed class AreaApiTests(AtlasApiFixture atlas)
{
    private readonly HttpClient _client = atlas.Factory.CreateClient();
    private static readonly string Area = $"/api/v1/datasets/{SyntheticAtlas.CoastSlug}/area";

    // An invented quadrilateral over the middle of the test grid (lon, lat), closed.
    private const string Quadrilateral = "[[20.12,40.13],[20.71,40.21],[20.64,40.77],[20.18,40.69],[20.12,40.13]]";

    private static StringContent Json(string body) => new(body, Encoding.UTF8, "application/geo+json");

    private static string Polygon(string ring) => $$"""{"type":"Polygon","coordinates":[{{ring}}]}""";

    [Fact]
    public async Task AreaStatisticsUseTheCellsPostgisFindsWithinThePolygon()
    {
        var response = await _client.PostAsync($"{Area}?parameter=j&statistic=mean&period=annual&threshold=15", Json(Polygon(Quadrilateral)));
        var body = await response.Content.ReadAsStringAsync();
        Assert.True(response.StatusCode == HttpStatusCode.OK, body);
        var root = JsonDocument.Parse(body).RootElement;

        // PostGIS: wet cells whose centre is ST_Within the polygon, their stored J means, and the polygon's spheroid area.
        await using var command = atlas.DataSource.CreateCommand($"""
            WITH area AS (SELECT ST_GeomFromGeoJSON('{Polygon(Quadrilateral)}') AS g)
            SELECT count(*), avg(s.mean), min(s.mean), max(s.mean),
                   percentile_cont(0.9) WITHIN GROUP (ORDER BY s.mean),
                   count(*) FILTER (WHERE s.mean > 15),
                   (SELECT ST_Area(ST_SetSRID(g, 4326)::geography, true) / 1e6 FROM area)
              FROM cell c JOIN dataset d ON d.dataset_id = c.dataset_id AND d.slug = '{SyntheticAtlas.CoastSlug}'
              JOIN cell_statistic s ON s.dataset_id = c.dataset_id AND s.cell_id = c.cell_id AND s.period = 0 AND s.parameter = 3, area
             WHERE c.wet AND ST_Within(c.geom, ST_SetSRID(area.g, 4326))
            """);
        await using var reader = await command.ExecuteReaderAsync();
        await reader.ReadAsync();
        Assert.Equal(reader.GetInt64(0), root.GetProperty("cell_count").GetInt32());
        Assert.Equal(reader.GetDouble(1), root.GetProperty("mean").GetDouble(), 1e-9);
        Assert.Equal(reader.GetDouble(2), root.GetProperty("min").GetDouble(), 1e-9);
        Assert.Equal(reader.GetDouble(3), root.GetProperty("max").GetDouble(), 1e-9);
        // percentile_cont is linear interpolation between order statistics, as Hyndman-Fan type 7.
        Assert.Equal(reader.GetDouble(4), root.GetProperty("p90").GetDouble(), 1e-9);
        Assert.Equal(reader.GetInt64(5), root.GetProperty("cells_above_threshold").GetInt32());
        Assert.Equal(reader.GetDouble(6), root.GetProperty("area_km2").GetDouble(), 1e-6);
        Assert.True(root.GetProperty("area_above_threshold_km2").GetDouble() <= root.GetProperty("cell_area_km2").GetDouble());
        Assert.Equal("kW/m", root.GetProperty("layer").GetProperty("units").GetString());
    }

    [Fact]
    public async Task BoundingBoxAndFeatureBodiesAreAccepted()
    {
        var box = JsonDocument.Parse(await (await _client.PostAsync(Area, Json("""{"bbox":[20.05,40.05,20.35,40.35]}"""))).Content.ReadAsStringAsync()).RootElement;
        // Centres 20.1, 20.2, 20.3 by 40.1, 40.2, 40.3 lie inside: 9 cells.
        Assert.Equal(9, box.GetProperty("cell_count").GetInt32());
        var feature = await _client.PostAsync(Area, Json($$"""{"type":"Feature","properties":{},"geometry":{{Polygon(Quadrilateral)}}}"""));
        Assert.Equal(HttpStatusCode.OK, feature.StatusCode);
    }

    [Fact]
    public async Task SelfIntersectingPolygonIsRefusedWithWhereAndHowToFixIt()
    {
        var bowTie = Polygon("[[20.1,40.1],[20.6,40.6],[20.6,40.1],[20.1,40.6],[20.1,40.1]]");
        await Problems.AssertAsync(await _client.PostAsync(Area, Json(bowTie)), HttpStatusCode.UnprocessableEntity, "Self-intersection");
    }

    [Fact]
    public async Task HugePolygonIsRefusedNamingTheLimit()
    {
        var huge = Polygon("[[-10,20],[40,20],[40,60],[-10,60],[-10,20]]");
        await Problems.AssertAsync(await _client.PostAsync(Area, Json(huge)), HttpStatusCode.UnprocessableEntity, "the limit is 250000 km2");
    }

    [Fact]
    public async Task PolygonWithNoWetCellSaysWhyAndHowFarApartCellsAre()
    {
        var small = Polygon("[[20.51,40.51],[20.54,40.51],[20.54,40.54],[20.51,40.54],[20.51,40.51]]");
        await Problems.AssertAsync(await _client.PostAsync(Area, Json(small)), HttpStatusCode.UnprocessableEntity, "km apart");
        var land = Polygon("[[21.02,40.2],[21.15,40.2],[21.15,40.6],[21.02,40.6],[21.02,40.2]]");
        await Problems.AssertAsync(await _client.PostAsync(Area, Json(land)), HttpStatusCode.UnprocessableEntity, "No wet cell");
    }

    [Theory]
    [InlineData("""{"type":"Point","coordinates":[20.5,40.5]}""", HttpStatusCode.UnprocessableEntity, "Polygon or MultiPolygon")]
    [InlineData("not json at all", HttpStatusCode.BadRequest, "not valid JSON")]
    [InlineData("""{"type":"Polygon","coordinates":[[[200,40],[201,40],[201,41],[200,40]]]}""", HttpStatusCode.UnprocessableEntity, "longitude")]
    [InlineData("""{"bbox":[20.5,40.5,20.1,40.9]}""", HttpStatusCode.UnprocessableEntity, "west < east")]
    [InlineData("", HttpStatusCode.BadRequest, "Send a GeoJSON")]
    public async Task MalformedAreasAreProblemsSayingWhatToSend(string body, HttpStatusCode status, string detail)
    {
        await Problems.AssertAsync(await _client.PostAsync(Area, Json(body)), status, detail);
    }

    [Fact]
    public async Task OversizedBodyIsPayloadTooLargeAndBadLayerChoiceIsBadRequest()
    {
        var ring = string.Join(',', Enumerable.Range(0, 60_000).Select(k => string.Create(CultureInfo.InvariantCulture, $"[{20.1 + k * 1e-6},40.1]")));
        await Problems.AssertAsync(await _client.PostAsync(Area, Json(Polygon($"[{ring}]"))), HttpStatusCode.RequestEntityTooLarge, "limit");
        var problem = await Problems.AssertAsync(await _client.PostAsync($"{Area}?parameter=wind&threshold=lots", Json(Polygon(Quadrilateral))), HttpStatusCode.BadRequest);
        Assert.True(problem.GetProperty("errors").TryGetProperty("parameter", out _));
        Assert.True(problem.GetProperty("errors").TryGetProperty("threshold", out _));
    }
}
