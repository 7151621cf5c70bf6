using System.Text.Json;
using Microsoft.Playwright;

namespace Atlas.Browser.Tests;

/// <summary>Acts on the page's map the way a user does: by pixels, found from positions through the map itself.</summary>
public static class PageMap
{
    /// <summary>The page pixel of a position (the map's own projection, container offset added).</summary>
    public static async Task<(float X, float Y)> PixelOfAsync(IPage page, double lat, double lon)
    {
        var xy = await page.EvaluateAsync<float[]>(
            "([lat, lon]) => { const m = window.atlasPage.map; const p = m.latLngToContainerPoint([lat, lon]); " +
            "const r = m.getContainer().getBoundingClientRect(); return [r.left + p.x, r.top + p.y]; }", new[] { lat, lon });
        return (xy[0], xy[1]);
    }

    public static async Task ClickAsync(IPage page, double lat, double lon)
    {
        var (x, y) = await PixelOfAsync(page, lat, lon);
        await page.Mouse.ClickAsync(x, y);
    }

    /// <summary>Waits two animation frames, so that a redraw the page has requested has happened.</summary>
    public static Task NextFrameAsync(IPage page) =>
        page.EvaluateAsync("() => new Promise(done => requestAnimationFrame(() => requestAnimationFrame(done)))");

    /// <summary>Elements that reach past the right edge of the viewport (what makes a page scroll sideways).</summary>
    public static Task<string[]> OverflowingAsync(IPage page) =>
        page.EvaluateAsync<string[]>("() => [...document.querySelectorAll('body *')].filter(e => e.getBoundingClientRect().right > " +
            "document.documentElement.clientWidth + 0.5 && !e.closest('.leaflet-pane')).slice(0, 12).map(e => `${e.tagName.toLowerCase()}#${e.id}.${e.className} right ${e.getBoundingClientRect().right.toFixed(0)}`)");

    /// <summary>How many times the cell canvas has been painted.</summary>
    public static async Task<int> DrawsAsync(IPage page) =>
        int.Parse(await page.GetAttributeAsync("canvas.cell-canvas", "data-draws") ?? "0");

    /// <summary>The RGBA of the cell canvas at a position.</summary>
    public static async Task<int[]> CanvasColourAtAsync(IPage page, double lat, double lon) =>
        (await CanvasColoursAlongAsync(page, [(lat, lon, lat, lon)]))[0][0];

    /// <summary>The RGBA of the cell canvas at each of the cells' centres, read from one picture of the canvas.</summary>
    public static async Task<int[][]> CanvasColoursAtAsync(IPage page, IEnumerable<LayerCell> cells) =>
        (await CanvasColoursAlongAsync(page, cells.Select(c => (c.Lat, c.Lon, c.Lat, c.Lon)))).Select(line => line[0]).ToArray();

    /// <summary>
    /// The RGBA of every canvas pixel along each straight line between two positions (one pixel for a line of no
    /// length), all read from one picture of the canvas, so that no repaint falls between them. Positions off the
    /// canvas read as transparent.
    /// </summary>
    public static async Task<int[][][]> CanvasColoursAlongAsync(IPage page, IEnumerable<(double Lat0, double Lon0, double Lat1, double Lon1)> lines) =>
        await page.EvaluateAsync<int[][][]>("""
            (lines) => {
              const m = window.atlasPage.map, c = document.querySelector('canvas.cell-canvas'), k = c.width / c.clientWidth;
              const data = c.getContext('2d').getImageData(0, 0, c.width, c.height).data;
              const at = (x, y) => {
                x = Math.round(x); y = Math.round(y);
                if (x < 0 || y < 0 || x >= c.width || y >= c.height) return [0, 0, 0, 0];
                const i = 4 * (y * c.width + x);
                return [data[i], data[i + 1], data[i + 2], data[i + 3]];
              };
              return lines.map(([lat0, lon0, lat1, lon1]) => {
                const a = m.latLngToContainerPoint([lat0, lon0]), b = m.latLngToContainerPoint([lat1, lon1]);
                const steps = Math.ceil(a.distanceTo(b) * k);
                const pixels = [];
                for (let s = 0; s <= steps; s++) {
                  const t = steps ? s / steps : 0;
                  pixels.push(at((a.x + (b.x - a.x) * t) * k, (a.y + (b.y - a.y) * t) * k));
                }
                return pixels;
              });
            }
            """, lines.Select(l => new[] { l.Lat0, l.Lon0, l.Lat1, l.Lon1 }).ToArray());

    public static async Task<JsonElement> GetJsonAsync(HttpClient http, string url)
    {
        using var response = await http.GetAsync(url);
        Assert.True(response.IsSuccessStatusCode, $"{url}: {(int)response.StatusCode} {await response.Content.ReadAsStringAsync()}");
        using var document = JsonDocument.Parse(await response.Content.ReadAsStringAsync());
        return document.RootElement.Clone();
    }
}
