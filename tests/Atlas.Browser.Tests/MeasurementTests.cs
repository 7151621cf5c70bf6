using System.Globalization;
using System.Text;
using Xunit.Abstractions;

namespace Atlas.Browser.Tests;

/// <summary>
/// Records, without asserting on time (speed targets belong to benchmarks), the time from navigation start to the
/// first drawn layer and the bytes the page transferred, on loopback with an empty browser cache, into
/// tests/artifacts/page-measurements.txt.
/// </summary>
[Collection(AtlasSiteCollection.Name)]
public class MeasurementTests(AtlasSite site, ITestOutputHelper output)
{
    [Fact]
    public async Task FirstLayerTimeAndTransferredBytesAreRecorded()
    {
        var lines = new StringBuilder();
        for (var run = 1; run <= 2; run++)
        {
            await using var session = await site.OpenAsync();
            var page = session.Page;
            await page.WaitForFunctionAsync("() => document.body.dataset.firstLayerMs");
            await ShownLayer.WaitForLandAsync(page);
            // Every request of the first view has ended when the list of finished resources stops growing for 400 ms.
            await page.EvaluateAsync("""
                () => new Promise(done => {
                  let count = -1;
                  const check = () => { const now = performance.getEntriesByType('resource').length; if (now === count) done(); else { count = now; setTimeout(check, 400); } };
                  check();
                })
                """);
            var firstLayer = double.Parse((await page.GetAttributeAsync("body", "data-first-layer-ms"))!, CultureInfo.InvariantCulture);
            var bytes = await page.EvaluateAsync<double[]>("""
                () => {
                  const entries = [...performance.getEntriesByType('navigation'), ...performance.getEntriesByType('resource')];
                  return [entries.reduce((s, e) => s + (e.transferSize || 0), 0), entries.reduce((s, e) => s + (e.decodedBodySize || 0), 0), entries.length];
                }
                """);
            var line = string.Create(CultureInfo.InvariantCulture,
                $"run {run}: first drawn layer {firstLayer:F0} ms after navigation start; transferred {bytes[0] / 1024:F0} KiB ({bytes[1] / 1024:F0} KiB decoded) in {bytes[2]:F0} requests");
            output.WriteLine(line);
            lines.AppendLine(line);
            Assert.True(firstLayer > 0);
            Assert.True(bytes[0] > 0);
            Assert.Empty(session.Errors);
        }
        Directory.CreateDirectory(site.ArtifactFolder);
        await File.WriteAllTextAsync(Path.Combine(site.ArtifactFolder, "page-measurements.txt"),
            "Loopback, headless Chromium, empty cache per run; the first run also warms the server's caches.\n" +
            $"machine load average (1, 5, 15 min) during the run: {(await File.ReadAllTextAsync("/proc/loadavg")).Trim()} on {Environment.ProcessorCount} cores\n" + lines);
    }
}
