using System.Globalization;
using System.Text.Json;
using System.Text.RegularExpressions;
using System.Xml.Linq;
using Atlas.Api.Model;
using Atlas.Api.Tests.Assessment;
using Atlas.Api.Tests.Support;
using Atlas.TestSupport;

namespace Atlas.Api.Tests;

/// <summary>
/// The consent figure of a layer, PNG and SVG, read back by outside tools: Pillow (python3-pil) for the PNG's size and
/// its iTXt chunks (PNG specification, third edition, 11.3.3.4), librsvg's rsvg-convert for the SVG, and the SVG's
/// &lt;metadata&gt; and text as XML. The rendered files are kept under tests/artifacts/figures to be looked at.
/// </summary>
[Collection(AtlasApiCollection.Name)]
public sealed class LayerFigureTests(AtlasApiFixture atlas)
{
    private readonly HttpClient _client = atlas.Factory.CreateClient();
    private static readonly string Artifacts = Path.Combine(AssessmentAtlas.Checkout, "tests", "artifacts", "figures");

    [Theory]
    [InlineData("coast", "hs", "mean", "annual")]
    [InlineData("mesh", "hs", "mean", "annual")]
    public async Task FigureHasItsCaptionOnThePictureAndTheFullProvenanceInItsMetadata(string which, string parameter, string statistic, string period)
    {
        var slug = which == "coast" ? SyntheticAtlas.CoastSlug : SyntheticAtlas.MeshSlug;
        var stem = $"/api/v1/datasets/{slug}/layers/{parameter}/{statistic}/{period}";
        Directory.CreateDirectory(Artifacts);
        var png = Path.Combine(Artifacts, $"{slug}_{parameter}_{statistic}_{period}.png");
        var svg = Path.Combine(Artifacts, $"{slug}_{parameter}_{statistic}_{period}.svg");
        var svgAsPng = Path.Combine(Artifacts, $"{slug}_{parameter}_{statistic}_{period}.svg.png");
        await File.WriteAllBytesAsync(png, await _client.GetByteArrayAsync($"{stem}.png"));
        var svgResponse = await _client.GetAsync($"{stem}.svg");
        Assert.Equal("image/svg+xml", svgResponse.Content.Headers.ContentType?.MediaType);
        await File.WriteAllBytesAsync(svg, await svgResponse.Content.ReadAsByteArrayAsync());
        var sidecar = JsonDocument.Parse(await _client.GetStringAsync($"{stem}.figure.json")).RootElement;
        var caption = sidecar.GetProperty("caption").GetString()!;

        // The short caption: dataset, parameter, statistic, period, units, the caution, and where the provenance is.
        Assert.Contains($"({slug})", caption);
        Assert.Contains("significant wave height Hm0 (hs)", caption);
        Assert.Contains("statistic: mean", caption);
        Assert.Contains("period: annual", caption);
        Assert.Contains("units: m", caption);
        Assert.Contains(AtlasCaution.Text, caption);
        Assert.EndsWith("Provenance: see metadata.", caption);
        Assert.DoesNotContain(SyntheticAtlas.SourceChecksum, caption);

        // The PNG read by Pillow: its size, and its text chunks holding the provenance.
        var pil = JsonDocument.Parse(ExternalTool.Run(ExternalTool.Python, "-c",
            "import json, sys\nfrom PIL import Image\nim = Image.open(sys.argv[1])\nim.load()\n" +
            "print(json.dumps({'size': im.size, 'text': {k: str(v) for k, v in im.text.items()}}))", png)).RootElement;
        Assert.True(pil.GetProperty("size")[0].GetInt32() > 700, pil.GetProperty("size").ToString());
        var text = pil.GetProperty("text");
        Assert.Equal(caption, text.GetProperty("Description").GetString());
        Assert.Equal(AtlasCaution.Text, text.GetProperty("Disclaimer").GetString());
        // Every source file with its checksum (the coast dataset was loaded from one file; the mesh was stored without any).
        var sources = sidecar.GetProperty("provenance").GetProperty("source_files").EnumerateArray().Select(f => f.GetProperty("checksum").GetString()!).ToArray();
        if (which == "coast") Assert.Equal([SyntheticAtlas.SourceChecksum], sources);
        foreach (var checksum in sources) Assert.Contains(checksum, text.GetProperty("Source").GetString());
        if (sources.Length == 0) Assert.Equal("no source files recorded", text.GetProperty("Source").GetString());
        Assert.Contains("Method:", text.GetProperty("Comment").GetString());
        Assert.Equal(sidecar.GetProperty("metadata").GetProperty("Comment").GetString(), text.GetProperty("Comment").GetString());
        // Method notes name methods in words, never a code identifier (a joined-up capitalised name such as an enum member).
        Assert.DoesNotMatch(@"\b[A-Z][a-z]+[A-Z][A-Za-z]*\d*\b", text.GetProperty("Comment").GetString()!);

        // The SVG: rendered by librsvg, its metadata in RDF with Dublin Core terms, and the caption as text.
        ExternalTool.Run("rsvg-convert", "-o", svgAsPng, svg);
        var rendered = JsonDocument.Parse(ExternalTool.Run(ExternalTool.Python, "-c",
            "import json, sys\nfrom PIL import Image\nprint(json.dumps(Image.open(sys.argv[1]).size))", svgAsPng)).RootElement;
        Assert.Equal(pil.GetProperty("size")[0].GetInt32(), rendered[0].GetInt32());
        Assert.Equal((byte)'<', (await File.ReadAllBytesAsync(svg))[0]);  // no byte order mark
        // The vector form draws the same map: cells stay blocks of their colour (a viewer's smoothing of the embedded
        // map must not blend neighbouring cells into colours of values that are not there). Mean absolute difference per
        // channel of the two renderings inside the map (x 80-500, y 140-600, clear of labels, arrow and legend), by
        // NumPy; graticule lines antialias a little differently, so 1 of 255 (a smoothed map differs by several).
        var difference = double.Parse(ExternalTool.Run(ExternalTool.Python, "-c",
            "import sys, numpy as np\nfrom PIL import Image\na = np.asarray(Image.open(sys.argv[1]).convert('RGB'), float)\n" +
            "b = np.asarray(Image.open(sys.argv[2]).convert('RGB'), float)\nprint(np.abs(a[140:600, 80:500] - b[140:600, 80:500]).mean())",
            png, svgAsPng).Trim(), CultureInfo.InvariantCulture);
        Assert.True(difference < 1, $"the SVG's map renders {difference:0.00} of 255 away from the PNG's on average");
        var document = XDocument.Load(svg);
        XNamespace dc = "http://purl.org/dc/elements/1.1/", dcterms = "http://purl.org/dc/terms/";
        var metadata = document.Root!.Elements().Single(e => e.Name.LocalName == "metadata");
        Assert.Equal(text.GetProperty("Source").GetString(), metadata.Descendants(dc + "source").Single().Value);
        Assert.Equal(text.GetProperty("Comment").GetString(), metadata.Descendants(dcterms + "provenance").Single().Value);
        var words = Regex.Replace(string.Join(" ", document.Descendants().Where(e => e.Name.LocalName == "text").Select(e => e.Value)), @"\s+", " ");
        foreach (var line in new[] { "Provenance: see metadata.", "N", "km", "0" }) Assert.Contains(line, words);
        foreach (var sha in sources) Assert.DoesNotContain(sha, words);
    }
}
