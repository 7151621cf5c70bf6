using System.Text.Json;

namespace Atlas.Browser.Tests;

/// <summary>The dashed dataset-extent outline goes round the whole grid, sea and land cells alike.</summary>
[Collection(AtlasSiteCollection.Name)]
public class ExtentOutlineTests(AtlasSite site)
{
    [Fact]
    public async Task ExtentOutlineEnclosesTheLandMaskAndTheSeaCells()
    {
        await using var session = await site.OpenAsync();
        var page = session.Page;
        await ShownLayer.WaitForLandAsync(page);
        // The grid's edges from the API: the footprints of the sea cells and of the land mask's dry cells.
        var sea = await PageMap.GetJsonAsync(site.Http, $"/api/v1/datasets/{AtlasSite.Slug}/layers/j/mean/annual.geojson?geometry=polygon");
        var land = await PageMap.GetJsonAsync(site.Http, $"/api/v1/datasets/{AtlasSite.Slug}/land");
        var (west, south, east, north) = Bounds(Positions(sea).Concat(Positions(land)));
        var (seaWest, _, seaEast, _) = Bounds(Positions(sea));
        Assert.True(east > seaEast || west < seaWest, "the test coast has land beyond the sea cells at an edge of the grid");

        // The outline as drawn: the dashed rectangle's box on the page.
        var outline = page.Locator(".leaflet-overlay-pane path[stroke-dasharray]");
        await PageMap.NextFrameAsync(page);
        var box = await outline.BoundingBoxAsync();
        Assert.NotNull(box);
        var (x0, y0) = await PageMap.PixelOfAsync(page, north, west);
        var (x1, y1) = await PageMap.PixelOfAsync(page, south, east);
        // Within the stroke (1.5 px, half each side) and a pixel of rounding.
        const double tolerance = 2.5;
        Assert.InRange(box.X, x0 - tolerance, x0 + tolerance);
        Assert.InRange(box.Y, y0 - tolerance, y0 + tolerance);
        Assert.InRange(box.X + box.Width, x1 - tolerance, x1 + tolerance);
        Assert.InRange(box.Y + box.Height, y1 - tolerance, y1 + tolerance);
        Assert.Empty(session.Errors);
    }

    private static IEnumerable<(double Lon, double Lat)> Positions(JsonElement collection)
    {
        foreach (var feature in collection.GetProperty("features").EnumerateArray())
            foreach (var position in Flatten(feature.GetProperty("geometry").GetProperty("coordinates")))
                yield return position;
    }

    private static IEnumerable<(double Lon, double Lat)> Flatten(JsonElement coordinates) =>
        coordinates[0].ValueKind == JsonValueKind.Number
            ? [(coordinates[0].GetDouble(), coordinates[1].GetDouble())]
            : coordinates.EnumerateArray().SelectMany(Flatten);

    private static (double West, double South, double East, double North) Bounds(IEnumerable<(double Lon, double Lat)> positions)
    {
        var list = positions.ToArray();
        return (list.Min(p => p.Lon), list.Min(p => p.Lat), list.Max(p => p.Lon), list.Max(p => p.Lat));
    }
}
