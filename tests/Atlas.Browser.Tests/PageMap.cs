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
        await page.EvaluateAsync<int[]>(
            "([lat, lon]) => { const m = window.atlasPage.map; const c = document.querySelector('canvas.cell-canvas'); " +
            "const p = m.latLngToContainerPoint([lat, lon]); const k = c.width / c.clientWidth; " +
            "return Array.from(c.getContext('2d').getImageData(Math.round(p.x * k), Math.round(p.y * k), 1, 1).data); }", new[] { lat, lon });

    public static async Task<JsonElement> GetJsonAsync(HttpClient http, string url)
    {
        using var response = await http.GetAsync(url);
        Assert.True(response.IsSuccessStatusCode, $"{url}: {(int)response.StatusCode} {await response.Content.ReadAsStringAsync()}");
        using var document = JsonDocument.Parse(await response.Content.ReadAsStringAsync());
        return document.RootElement.Clone();
    }
}
