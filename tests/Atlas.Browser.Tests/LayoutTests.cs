using Microsoft.Playwright;

namespace Atlas.Browser.Tests;

[Collection(AtlasSiteCollection.Name)]
public class LayoutTests(AtlasSite site)
{
    [Fact]
    public async Task NarrowScreenKeepsTheMapAndPanelsWithoutSidewaysScrolling()
    {
        await using var session = await site.OpenAsync(390, 844);
        var page = session.Page;
        Assert.True(await page.EvaluateAsync<bool>("() => document.documentElement.scrollWidth <= 390"),
            "the page scrolls sideways at 390 px: " + string.Join("; ", await PageMap.OverflowingAsync(page)));
        var map = await page.Locator("#map").BoundingBoxAsync();
        Assert.NotNull(map);
        Assert.True(map.Width >= 380 && map.Height >= 300, $"map is {map.Width} x {map.Height}");
        await page.ScreenshotAsync(new PageScreenshotOptions { Path = Path.Combine(site.ScreenshotFolder, "narrow-layer.png") });
        await page.ScreenshotAsync(new PageScreenshotOptions { Path = Path.Combine(site.ScreenshotFolder, "narrow-layer-full.png"), FullPage = true });

        var cell = await SeaCells.OffshoreAsync(site.Http);
        await PageMap.ClickAsync(page, cell.Lat, cell.Lon);
        await page.WaitForSelectorAsync("#point-stats");
        var panel = await page.Locator("#point-panel").BoundingBoxAsync();
        Assert.NotNull(panel);
        Assert.True(panel.Y >= map.Y + map.Height - 1, "the point panel sits under the map on a narrow screen");
        Assert.True(await page.EvaluateAsync<bool>("() => document.documentElement.scrollWidth <= 390"),
            "the point panel makes the page scroll sideways: " + string.Join("; ", await PageMap.OverflowingAsync(page)));
        await page.Locator("#point-panel").ScrollIntoViewIfNeededAsync();
        await page.ScreenshotAsync(new PageScreenshotOptions { Path = Path.Combine(site.ScreenshotFolder, "narrow-point.png") });
        await page.ScreenshotAsync(new PageScreenshotOptions { Path = Path.Combine(site.ScreenshotFolder, "narrow-point-full.png"), FullPage = true });
        Assert.Empty(session.Errors);
    }

    [Fact]
    public async Task EveryControlIsReachableByTabAndShowsFocus()
    {
        await using var session = await site.OpenAsync();
        var page = session.Page;
        var wanted = new[] { "layer-parameter", "layer-statistic", "layer-period", "map", "area-draw", "area-upload" };
        var reached = new HashSet<string>();
        for (var k = 0; k < 80 && !wanted.All(reached.Contains); k++)
        {
            await page.Keyboard.PressAsync("Tab");
            var focus = await page.EvaluateAsync<string[]>(
                "() => { const e = document.activeElement; const s = getComputedStyle(e); return [e.id, s.outlineStyle, s.outlineWidth]; }");
            if (focus[0].Length == 0) continue;
            reached.Add(focus[0]);
            if (focus[0] is "layer-parameter" or "area-draw")
                Assert.True(focus[1] != "none" && focus[2] != "0px", $"#{focus[0]} shows no focus outline ({focus[1]} {focus[2]})");
        }
        Assert.All(wanted, id => Assert.Contains(id, reached));
    }

    [Fact]
    public async Task TextContrastMeetsWcagAa()
    {
        await using var session = await site.OpenAsync();
        var page = session.Page;
        var cell = await SeaCells.OffshoreAsync(site.Http);
        await PageMap.ClickAsync(page, cell.Lat, cell.Lon);
        await page.WaitForSelectorAsync(".joint-table");
        // WCAG 2.2, success criterion 1.4.3 and its definitions of relative luminance and contrast ratio: 4.5:1 for
        // text, 3:1 for large text (at least 18.66 px bold or 24 px). Backgrounds are found by walking up to the
        // first opaque background colour; text over the map canvas is skipped (it has its own opaque box).
        var failures = await page.EvaluateAsync<string[]>("""
            () => {
              const parse = c => { const m = c.match(/rgba?\(([^)]+)\)/); if (!m) return null;
                const p = m[1].split(/[ ,\/]+/).filter(Boolean).map(Number); return { r: p[0], g: p[1], b: p[2], a: p.length > 3 ? p[3] : 1 }; };
              const lin = v => { v /= 255; return v <= 0.04045 ? v / 12.92 : Math.pow((v + 0.055) / 1.055, 2.4); };
              const lum = c => 0.2126 * lin(c.r) + 0.7152 * lin(c.g) + 0.0722 * lin(c.b);
              const background = e => { for (let n = e; n; n = n.parentElement) { const c = parse(getComputedStyle(n).backgroundColor); if (c && c.a >= 0.9) return c; } return { r: 255, g: 255, b: 255, a: 1 }; };
              const bad = [];
              const walker = document.createTreeWalker(document.body, NodeFilter.SHOW_TEXT);
              for (let t = walker.nextNode(); t; t = walker.nextNode()) {
                const e = t.parentElement; if (!t.textContent.trim() || !e) continue;
                if (e.closest('.leaflet-pane, .visually-hidden, [hidden], script, style, option')) continue;
                const box = e.getBoundingClientRect(); if (box.width === 0 || box.height === 0) continue;
                const s = getComputedStyle(e); if (s.visibility === 'hidden' || s.display === 'none') continue;
                const fg = parse(s.color), bg = background(e);
                const [hi, lo] = [lum(fg), lum(bg)].sort((a, b) => b - a);
                const ratio = (hi + 0.05) / (lo + 0.05);
                const size = parseFloat(s.fontSize), bold = Number(s.fontWeight) >= 700;
                const need = size >= 24 || (bold && size >= 18.66) ? 3 : 4.5;
                if (ratio < need) bad.push(`${e.tagName.toLowerCase()}.${e.className} "${t.textContent.trim().slice(0, 30)}" ${ratio.toFixed(2)} < ${need}`);
              }
              return bad;
            }
            """);
        Assert.Empty(failures);
    }
}
