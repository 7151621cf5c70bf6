using System.Globalization;
using System.Text.Json;
using Atlas.Api.Downloads;
using Atlas.Api.Tests.Support;
using Atlas.TestSupport;

namespace Atlas.Api.Tests;

/// <summary>
/// The house colour scales: perceptually ordered and evenly spaced in OKLab (B. Ottosson 2020), a path of their own
/// (measured against matplotlib's and colorcet's tables), the cyclic one closing on itself, and one table for figures and page.
/// </summary>
[Collection(AtlasApiCollection.Name)]
public sealed class ColourScaleTests(AtlasApiFixture atlas)
{
    private readonly HttpClient _client = atlas.Factory.CreateClient();

    [Fact]
    public void OkLabConversionMatchesPublishedValues()
    {
        // sRGB white is L 1, a = b = 0 (the definition of the space); sRGB red is oklab(0.62796 0.22486 0.12585)
        // (CSS Color Module Level 4's worked examples, from memory); tolerance 1e-4.
        var white = OkLab.FromSrgb(255, 255, 255);
        Assert.Equal(1, white.L, 1e-4);
        Assert.Equal(0, white.A, 1e-4);
        Assert.Equal(0, white.B, 1e-4);
        var red = OkLab.FromSrgb(255, 0, 0);
        Assert.Equal(0.62796, red.L, 1e-4);
        Assert.Equal(0.22486, red.A, 1e-4);
        Assert.Equal(0.12585, red.B, 1e-4);
        Assert.Equal((byte)255, OkLab.ToSrgbBytes(red.L, red.A, red.B).R);
    }

    [Fact]
    public void SequentialScaleRisesInLightnessAtEvenPerceivedSteps()
    {
        var ramp = ColourScale.Ramp;
        for (var i = 1; i < ColourScale.Steps; i++)
        {
            Assert.True(ramp.LightnessOf(i) > ramp.LightnessOf(i - 1), $"lightness falls at entry {i}");
            // Read back from the 8-bit colours: never darker than the entry before, beyond 8-bit rounding.
            Assert.True(Lab(ramp.Colours[i]).L >= Lab(ramp.Colours[i - 1]).L - 0.003, $"entry {i} is darker than entry {i - 1}");
        }
        Assert.Equal(ColourScale.LightnessAt(0.5), ramp.LightnessOf(128), 12);
        // Even steps: the colour difference over each run of 8 entries is the same to within 20 % (8-bit rounding).
        var runs = Enumerable.Range(0, 31).Select(k => Distance(Lab(ramp.Colours[8 * k]), Lab(ramp.Colours[8 * k + 8]))).ToArray();
        Assert.True(runs.Max() / runs.Min() < 1.2, $"steps of 8 entries range {runs.Min():0.0000}..{runs.Max():0.0000} in OKLab");
        Assert.Equal(ramp.Colours[0], ColourScale.At(-1));
        Assert.Equal(ramp.Colours[255], ColourScale.At(2));
        Assert.Null(ColourScale.At(double.NaN));
    }

    [Fact]
    public void SequentialScaleIsNoWellKnownPlottingLibraryMap()
    {
        // The comparison sources: every colour map matplotlib registers (python3-matplotlib) and every 256-entry
        // non-cyclic palette of colorcet (python3-colorcet: Kovesi's perceptually uniform maps), each sampled at 256
        // fractions and compared both ways round.
        var output = ExternalTool.Run(ExternalTool.Python, "-c",
            "import json\nimport numpy as np\nimport colorcet\nfrom matplotlib import colormaps\n" +
            "maps = {}\n" +
            "for n in list(colormaps):\n" +
            "    if n.endswith('_r') or n.startswith('cet_'): continue\n" +
            "    maps['matplotlib ' + n] = np.round(colormaps[n](np.linspace(0, 1, 256))[:, :3] * 255).astype(int).tolist()\n" +
            "for n, p in colorcet.palette.items():\n" +
            "    if len(p) == 256 and 'cyclic' not in n: maps['colorcet ' + n] = [[int(h[i:i + 2], 16) for i in (1, 3, 5)] for h in p]\n" +
            "print(json.dumps(maps))");
        var maps = JsonDocument.Parse(output).RootElement;
        Assert.Contains(maps.EnumerateObject(), m => m.Name == "matplotlib viridis");
        Assert.Contains(maps.EnumerateObject(), m => m.Name == "colorcet bgy");
        var ours = ColourScale.Ramp.Colours.Select(Lab).ToArray();
        var checkedMaps = 0;
        foreach (var map in maps.EnumerateObject())
        {
            var theirs = map.Value.EnumerateArray().Select(c => Lab(((byte)c[0].GetInt32(), (byte)c[1].GetInt32(), (byte)c[2].GetInt32()))).ToArray();
            if (theirs.Length != ours.Length) continue;
            var mean = Math.Min(ours.Zip(theirs, Distance).Average(), ours.Zip(theirs.Reverse(), Distance).Average());
            // Every sequential map with a similar lightness ramp shares the L axis, so the distance lies in hue and
            // chroma; 0.07 is about twice the mean distance of this project's former ramp from viridis (0.036).
            Assert.True(mean >= 0.07, $"mean OKLab difference from {map.Name} is {mean:0.000}");
            checkedMaps++;
        }
        Assert.True(checkedMaps > 100, $"only {checkedMaps} maps compared");
    }

    [Fact]
    public void DirectionScaleHasOneLightnessAndClosesOnItself()
    {
        var ramp = DirectionColourScale.Ramp;
        Assert.Equal(DirectionColourScale.At(0), DirectionColourScale.At(1));
        Assert.Equal(DirectionColourScale.AtDegrees(0), DirectionColourScale.AtDegrees(360));
        Assert.Equal(DirectionColourScale.AtDegrees(-90), DirectionColourScale.AtDegrees(270));
        Assert.NotEqual(DirectionColourScale.AtDegrees(0), DirectionColourScale.AtDegrees(180));
        for (var i = 0; i < DirectionColourScale.Steps; i++)
        {
            Assert.Equal(DirectionColourScale.Lightness, ramp.LightnessOf(i), 9);
            Assert.Equal(DirectionColourScale.Lightness, Lab(ramp.Colours[i]).L, 0.005);
        }
        // The seam between the last entry and the first is a step like any other (within 8-bit rounding).
        var steps = Enumerable.Range(0, DirectionColourScale.Steps)
            .Select(i => Distance(Lab(ramp.Colours[i]), Lab(ramp.Colours[(i + 1) % DirectionColourScale.Steps]))).ToArray();
        var median = steps.Order().ElementAt(steps.Length / 2);
        Assert.InRange(steps[^1], 0.3 * median, 2.5 * median);
    }

    [Fact]
    public async Task ServedTablesAreTheFiguresOwn()
    {
        var root = JsonDocument.Parse(await _client.GetStringAsync("/api/v1/colour-scales")).RootElement;
        var sequential = root.GetProperty("sequential");
        var direction = root.GetProperty("direction");
        Assert.False(sequential.GetProperty("cyclic").GetBoolean());
        Assert.True(direction.GetProperty("cyclic").GetBoolean());
        for (var k = 0; k <= 10; k++)
        {
            var f = k / 10.0;
            Assert.Equal(ColourRamp.Hex(ColourScale.At(f)!.Value), sequential.GetProperty("colours")[(int)Math.Round(f * 255)].GetString());
            Assert.Equal(ColourRamp.Hex(DirectionColourScale.At(f)!.Value), direction.GetProperty("colours")[(int)Math.Floor(f * 256) % 256].GetString());
        }
    }

    private static (double L, double A, double B) Lab((byte R, byte G, byte B) c) => OkLab.FromSrgb(c.R, c.G, c.B);

    private static double Distance((double L, double A, double B) p, (double L, double A, double B) q) =>
        Math.Sqrt((p.L - q.L) * (p.L - q.L) + (p.A - q.A) * (p.A - q.A) + (p.B - q.B) * (p.B - q.B));
}
