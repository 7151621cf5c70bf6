using System.Net;
using System.Text.Json;
using Atlas.Api.Model;
using Atlas.Api.Tests.Support;

namespace Atlas.Api.Tests;

[Collection(AtlasApiCollection.Name)]
public sealed class DatasetApiTests(AtlasApiFixture atlas)
{
    private readonly HttpClient _client = atlas.Factory.CreateClient();

    [Fact]
    public async Task CatalogueListsEveryDatasetWithExtentAndCaution()
    {
        var root = JsonDocument.Parse(await _client.GetStringAsync("/api/v1/datasets")).RootElement;
        var slugs = root.GetProperty("datasets").EnumerateArray().Select(d => d.GetProperty("slug").GetString()).ToArray();
        Assert.Contains(SyntheticAtlas.CoastSlug, slugs);
        Assert.Contains(SyntheticAtlas.MeshSlug, slugs);
        Assert.Equal(AtlasCaution.Text, root.GetProperty("caution").GetString());
        var coast = root.GetProperty("datasets").EnumerateArray().Single(d => d.GetProperty("slug").GetString() == SyntheticAtlas.CoastSlug);
        // The extent is the envelope of the wet cell centres: columns 0..9 and rows 0..9 of the invented grid.
        var extent = coast.GetProperty("extent");
        Assert.Equal(SyntheticAtlas.West, extent.GetProperty("west").GetDouble(), 9);
        Assert.Equal(SyntheticAtlas.Longitude(SyntheticAtlas.FirstDryColumn - 1), extent.GetProperty("east").GetDouble(), 9);
        Assert.Equal(100, coast.GetProperty("wet_cell_count").GetInt32());
    }

    [Fact]
    public async Task DetailGivesTimeStepSourceChecksumsLicenceAndValidation()
    {
        var d = JsonDocument.Parse(await _client.GetStringAsync($"/api/v1/datasets/{SyntheticAtlas.CoastSlug}")).RootElement;
        Assert.Equal("regular", d.GetProperty("grid_kind").GetString());
        Assert.Equal(SyntheticAtlas.Nx, d.GetProperty("nx").GetInt32());
        Assert.Equal(SyntheticAtlas.StepSeconds, d.GetProperty("time").GetProperty("step_seconds").GetInt32());
        Assert.Equal([2019, 2020], d.GetProperty("time").GetProperty("years").EnumerateArray().Select(y => y.GetInt32()));
        var file = d.GetProperty("source_files").EnumerateArray().Single();
        Assert.Equal(SyntheticAtlas.SourceChecksum, file.GetProperty("checksum").GetString());
        Assert.Equal("Invented test data, free to use", d.GetProperty("licence").GetString());
        Assert.Equal(0.14, d.GetProperty("validation").GetProperty("hs_scatter_index").GetDouble());
        Assert.Equal("m", d.GetProperty("variables").GetProperty("hs").GetProperty("units").GetString());
        Assert.Contains(d.GetProperty("parameters").EnumerateArray(), p => p.GetProperty("symbol").GetString() == "j" && p.GetProperty("units").GetString() == "kW/m");
        Assert.Contains("power", d.GetProperty("method_notes").GetString());
        Assert.Equal(AtlasCaution.Text, d.GetProperty("caution").GetString());
    }

    [Fact]
    public async Task UnknownDatasetIsANotFoundProblemNamingTheCatalogue()
    {
        var response = await _client.GetAsync("/api/v1/datasets/no-such-coast");
        await Problems.AssertAsync(response, HttpStatusCode.NotFound, "GET /api/v1/datasets");
    }

    [Fact]
    public async Task LandMaskCoversTheDryCells()
    {
        var root = JsonDocument.Parse(await _client.GetStringAsync($"/api/v1/datasets/{SyntheticAtlas.CoastSlug}/land")).RootElement;
        Assert.Equal("FeatureCollection", root.GetProperty("type").GetString());
        Assert.Equal(20, root.GetProperty("dry_cell_count").GetInt32());  // the two dry columns of ten rows
        Assert.Equal("MultiPolygon", root.GetProperty("features")[0].GetProperty("geometry").GetProperty("type").GetString());
        // RFC 7946 section 3.1.6: each polygon's exterior ring is counter-clockwise, its holes clockwise.
        foreach (var polygon in root.GetProperty("features")[0].GetProperty("geometry").GetProperty("coordinates").EnumerateArray())
            foreach (var (ring, k) in polygon.EnumerateArray().Select((r, k) => (r, k)))
                Assert.True(k == 0 ? LayerApiTests.SignedArea(ring) > 0 : LayerApiTests.SignedArea(ring) < 0);
    }
}
