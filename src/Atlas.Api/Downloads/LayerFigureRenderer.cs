using System.Xml.Linq;
using Atlas.Hindcast.Geodesy;
using NetTopologySuite.Geometries.Prepared;
using SkiaSharp;

namespace Atlas.Api.Downloads;

/// <summary>
/// A layer as a consent figure, in PNG and in SVG (vector, drawn by SkiaSharp's SVG canvas) from one drawing: the map
/// (longitude scaled by the cosine of the mid latitude, so shapes are true near the middle) in the house colour scale
/// (<see cref="DirectionColourScale"/> for mean directions, <see cref="ColourScale"/> otherwise), the dataset's own
/// land mask, a graticule with labels, a north arrow, a scale bar of geodesic length (WGS 84) in a round number of
/// kilometres, a colour bar with the unit, a title, and a short caption (dataset, parameter, statistic, period,
/// units, the caution, "provenance: see metadata"). The full provenance goes into the file's metadata (PNG iTXt
/// chunks, SVG &lt;metadata&gt;) and the sidecar JSON (<see cref="FigureProvenance"/>), not under the map.
/// </summary>
public static class LayerFigureRenderer
{
    private const int MapMaxWidth = 760, MapMaxHeight = 600, MaxImageSide = 1600;
    private const int Left = 64, Top = 64, Right = 150, CaptionGap = 78, CaptionLine = 15, Margin = 16, LegendRow = 22;
    private static readonly SKColor NoDataColour = new(0xEE, 0xEF, 0xEC);
    private static readonly SKColor GraticuleColour = new(0x55, 0x61, 0x6B, 0x70);
    private static readonly SKColor Ink = new(0x22, 0x22, 0x22);
    private const string FontFamily = "DejaVu Sans";

    /// <summary>The PNG figure without a land mask (kept for callers that have none).</summary>
    public static byte[] Render(LayerRaster raster, LayerData data) => RenderPng(raster, data, []);

    /// <summary>The figure as PNG, its provenance in iTXt chunks.</summary>
    public static byte[] RenderPng(LayerRaster raster, LayerData data, IReadOnlyList<Polygon> land)
    {
        var figure = new Figure(raster, data, land);
        using var surface = SKSurface.Create(new SKImageInfo(figure.Width, figure.Height, SKColorType.Rgba8888, SKAlphaType.Premul));
        figure.Draw(surface.Canvas);
        using var snapshot = surface.Snapshot();
        using var png = snapshot.Encode(SKEncodedImageFormat.Png, 100);
        return PngTextChunks.Add(png.ToArray(), figure.Provenance.Items);
    }

    /// <summary>The figure as SVG, its provenance in a &lt;metadata&gt; element (RDF with Dublin Core terms).</summary>
    public static byte[] RenderSvg(LayerRaster raster, LayerData data, IReadOnlyList<Polygon> land)
    {
        var figure = new Figure(raster, data, land);
        using var stream = new MemoryStream();
        using (var canvas = SKSvgCanvas.Create(new SKRect(0, 0, figure.Width, figure.Height), stream))
            figure.Draw(canvas);
        stream.Position = 0;
        var svg = XDocument.Load(stream);
        XNamespace rdf = "http://www.w3.org/1999/02/22-rdf-syntax-ns#", dc = "http://purl.org/dc/elements/1.1/",
            dcterms = "http://purl.org/dc/terms/", rdfs = "http://www.w3.org/2000/01/rdf-schema#";
        var root = svg.Root!;
        XNamespace ns = root.Name.Namespace;
        // Viewers that honour it draw the map's cells unsmoothed (CSS Images 3, image-rendering).
        foreach (var image in root.Descendants(ns + "image")) image.SetAttributeValue("style", "image-rendering:pixelated");
        var items = figure.Provenance.Items.ToDictionary(i => i.Key, i => i.Value);
        var description = new XElement(rdf + "Description",
            new XElement(dc + "title", items["Title"]),
            new XElement(dc + "description", items["Description"]),
            new XElement(dc + "source", items["Source"]),
            new XElement(dc + "creator", items["Software"]),
            new XElement(dc + "date", items["Creation Time"]),
            new XElement(dcterms + "provenance", items["Comment"]),
            new XElement(rdfs + "comment", items["Disclaimer"]));
        if (items.TryGetValue("Copyright", out var licence)) description.Add(new XElement(dc + "rights", licence));
        if (items.TryGetValue("Citation", out var citation)) description.Add(new XElement(dcterms + "bibliographicCitation", citation));
        root.AddFirst(
            new XElement(ns + "title", figure.Provenance.Title),
            new XElement(ns + "metadata", new XAttribute("id", "provenance"),
                new XElement(rdf + "RDF",
                    new XAttribute(XNamespace.Xmlns + "rdf", rdf.NamespaceName), new XAttribute(XNamespace.Xmlns + "dc", dc.NamespaceName),
                    new XAttribute(XNamespace.Xmlns + "dcterms", dcterms.NamespaceName), new XAttribute(XNamespace.Xmlns + "rdfs", rdfs.NamespaceName),
                    description)));
        // UTF-8 without a byte order mark: tools that read the file as text (and XML parsers given that text) expect '<' first.
        using var output = new MemoryStream();
        using (var writer = System.Xml.XmlWriter.Create(output, new System.Xml.XmlWriterSettings { Encoding = new UTF8Encoding(false), Indent = false }))
            svg.Save(writer);
        return output.ToArray();
    }

    /// <summary>The provenance a figure of <paramref name="data"/> carries (its caption and metadata items).</summary>
    public static FigureProvenance ProvenanceOf(LayerData data) => FigureProvenance.Of(data, Cyclic(data) ? DirectionColourScale.Name : ColourScale.Name);

    private static bool Cyclic(LayerData data) => data.Request.Parameter == WaveParameter.Dir && data.Request.Statistic == StatisticKind.Mean;

    /// <summary>The figure's layout, computed once and drawn on any canvas.</summary>
    private sealed class Figure
    {
        private readonly LayerRaster _raster;
        private readonly LayerData _data;
        private readonly IReadOnlyList<Polygon> _land;
        private readonly SKRect _map;
        private readonly string[] _caption;
        private readonly double _min, _max;
        private readonly bool _cyclic;

        public Figure(LayerRaster raster, LayerData data, IReadOnlyList<Polygon> land)
        {
            _raster = raster;
            _data = data;
            _land = land;
            _cyclic = Cyclic(data);
            Provenance = ProvenanceOf(data);
            var cos = Math.Max(0.05, Math.Cos((raster.North + raster.South) / 2 * Math.PI / 180));
            var aspect = (raster.East - raster.West) * cos / (raster.North - raster.South);
            double mapWidth = MapMaxWidth, mapHeight = MapMaxWidth / aspect;
            if (mapHeight > MapMaxHeight) { mapHeight = MapMaxHeight; mapWidth = MapMaxHeight * aspect; }
            Width = (int)Math.Ceiling(Left + mapWidth + Right);
            using var typeface = Typeface();
            using var small = new SKFont(typeface, 11);
            _caption = Wrap(Provenance.Caption, small, Width - 2 * Margin).ToArray();
            Height = (int)Math.Ceiling(Top + mapHeight + CaptionGap + _caption.Length * CaptionLine + 10);
            _map = new SKRect(Left, Top, (float)(Left + mapWidth), (float)(Top + mapHeight));
            (_min, _max) = _cyclic ? (0, 360) : raster.Range();
            if (_min == _max) { _min -= 0.5; _max += 0.5; }
        }

        public int Width { get; }
        public int Height { get; }
        public FigureProvenance Provenance { get; }

        public void Draw(SKCanvas canvas)
        {
            using var typeface = Typeface();
            using var titleFont = new SKFont(typeface, 17);
            using var font = new SKFont(typeface, 12);
            using var small = new SKFont(typeface, 11);
            using var ink = new SKPaint { Color = Ink, IsAntialias = true };
            using var line = new SKPaint { Color = Ink, IsStroke = true, StrokeWidth = 1, IsAntialias = true };

            canvas.Clear(SKColors.White);
            using (var background = new SKPaint { Color = NoDataColour })
                canvas.DrawRect(_map, background);
            using (var image = ImageOfRaster())
                canvas.DrawImage(image, _map, new SKSamplingOptions(SKFilterMode.Nearest), null);
            DrawLand(canvas);
            DrawGraticule(canvas, small, ink, line);
            canvas.DrawRect(_map, line);
            DrawNorthArrow(canvas, font, ink);

            canvas.DrawText(Capitalised(_data.Title), Left, 26, SKTextAlign.Left, titleFont, ink);
            canvas.DrawText($"{_data.Provenance.Title} ({_data.Provenance.Dataset})", Left, 46, SKTextAlign.Left, font, ink);
            var legend = Legend();
            var barBottom = _map.Bottom - legend.Count * LegendRow - (legend.Count > 0 ? 12 : 0);
            DrawColourBar(canvas, new SKRect(_map.Right + 24, _map.Top + 18, _map.Right + 42, barBottom), font, small, ink, line);
            DrawLegend(canvas, legend, new SKPoint(_map.Right + 24, barBottom + 12), small, ink, line);
            DrawScaleBar(canvas, small, ink, line);

            var y = _map.Bottom + CaptionGap;
            foreach (var text in _caption)
            {
                canvas.DrawText(text, Margin, y, SKTextAlign.Left, small, ink);
                y += CaptionLine;
            }
        }

        private (byte R, byte G, byte B)? ColourOf(double value) =>
            _cyclic ? DirectionColourScale.AtDegrees(value) : ColourScale.At((value - _min) / (_max - _min));

        /// <summary>
        /// The raster's colours, each pixel repeated to a block of whole pixels about as large as it is drawn (at most
        /// <see cref="MaxImageSide"/> a side): a viewer that smooths an embedded image (librsvg and browsers do in SVG)
        /// then blends only the blocks' edges, so cells stay cells and no colour of a value that is not there appears.
        /// </summary>
        private SKImage ImageOfRaster()
        {
            var factor = Math.Max(1, Math.Min((int)Math.Ceiling(_map.Width / _raster.Width),
                MaxImageSide / Math.Max(_raster.Width, _raster.Height)));
            using var bitmap = new SKBitmap(new SKImageInfo(_raster.Width, _raster.Height, SKColorType.Rgba8888, SKAlphaType.Premul));
            for (var row = 0; row < _raster.Height; row++)
            for (var column = 0; column < _raster.Width; column++)
            {
                var colour = ColourOf(_raster[column, row]);
                bitmap.SetPixel(column, row, colour is { } c ? new SKColor(c.R, c.G, c.B) : SKColors.Transparent);
            }
            if (factor == 1) return SKImage.FromBitmap(bitmap);
            using var blocks = bitmap.Resize(new SKImageInfo(_raster.Width * factor, _raster.Height * factor, SKColorType.Rgba8888, SKAlphaType.Premul),
                new SKSamplingOptions(SKFilterMode.Nearest));
            return SKImage.FromBitmap(blocks);
        }

        private SKPoint ToFigure(double lon, double lat) => new(
            (float)(_map.Left + (lon - _raster.West) / (_raster.East - _raster.West) * _map.Width),
            (float)(_map.Bottom - (lat - _raster.South) / (_raster.North - _raster.South) * _map.Height));

        private void DrawLand(SKCanvas canvas)
        {
            if (_land.Count == 0) return;
            using var builder = new SKPathBuilder { FillType = SKPathFillType.EvenOdd };
            foreach (var polygon in _land)
                foreach (var ring in new[] { polygon.ExteriorRing }.Concat(polygon.InteriorRings))
                {
                    var points = ring.Coordinates.Select(c => ToFigure(c.X, c.Y)).ToArray();
                    if (points.Length < 3) continue;
                    builder.MoveTo(points[0]);
                    foreach (var point in points.Skip(1)) builder.LineTo(point);
                    builder.Close();
                }
            using var path = builder.Detach();
            canvas.Save();
            canvas.ClipRect(_map);
            LandStyle.Draw(canvas, path, _map, 8, 0.8f);
            canvas.Restore();
        }

        /// <summary>The legend entries under the colour bar: land when the figure shows any, "no value" where cells lack one.</summary>
        private List<string> Legend()
        {
            var entries = new List<string>();
            if (_land.Count > 0) entries.Add("land");
            // A pixel without a value under the land is land; one elsewhere (a dry cell without a footprint, a gap in a
            // mesh, a cell whose statistic is missing) shows the no-value colour and needs its legend entry.
            var land = _land.Count == 0 ? null
                : PreparedGeometryFactory.Prepare(_land.Count == 1 ? _land[0] : _land[0].Factory.CreateMultiPolygon([.. _land]));
            var (dx, dy) = (_raster.PixelWidth, _raster.PixelHeight);
            var empty = false;
            for (var row = 0; row < _raster.Height && !empty; row++)
                for (var column = 0; column < _raster.Width && !empty; column++)
                    empty = double.IsNaN(_raster[column, row]) && (land is null ||
                        !land.Covers(land.Geometry.Factory.CreatePoint(new Coordinate(_raster.West + (column + 0.5) * dx, _raster.North - (row + 0.5) * dy))));
            if (empty) entries.Add("no value");
            return entries;
        }

        private static void DrawLegend(SKCanvas canvas, List<string> entries, SKPoint at, SKFont small, SKPaint ink, SKPaint line)
        {
            var y = at.Y;
            foreach (var entry in entries)
            {
                var swatch = new SKRect(at.X, y, at.X + 18, y + 12);
                if (entry == "land") LandStyle.Swatch(canvas, swatch, 8, 1);
                else
                    using (var fill = new SKPaint { Color = NoDataColour })
                        canvas.DrawRect(swatch, fill);
                canvas.DrawRect(swatch, line);
                canvas.DrawText(entry, swatch.Right + 6, swatch.Bottom - 1, SKTextAlign.Left, small, ink);
                y += LegendRow;
            }
        }

        private void DrawGraticule(SKCanvas canvas, SKFont small, SKPaint ink, SKPaint line)
        {
            using var grid = new SKPaint { Color = GraticuleColour, IsStroke = true, StrokeWidth = 0.6f, IsAntialias = true };
            foreach (var lon in NiceTicks.Between(_raster.West, _raster.East, 5))
            {
                var x = ToFigure(lon, _raster.South).X;
                canvas.DrawLine(x, _map.Top, x, _map.Bottom, grid);
                canvas.DrawLine(x, _map.Bottom, x, _map.Bottom + 4, line);
                canvas.DrawText(Degrees(lon, "E", "W"), x, _map.Bottom + 17, SKTextAlign.Center, small, ink);
            }
            foreach (var lat in NiceTicks.Between(_raster.South, _raster.North, 5))
            {
                var y = ToFigure(_raster.West, lat).Y;
                canvas.DrawLine(_map.Left, y, _map.Right, y, grid);
                canvas.DrawLine(_map.Left - 4, y, _map.Left, y, line);
                canvas.DrawText(Degrees(lat, "N", "S"), _map.Left - 6, y + 4, SKTextAlign.Right, small, ink);
            }
        }

        // The map is north-up (an equirectangular projection), so north is straight up everywhere on it.
        private void DrawNorthArrow(SKCanvas canvas, SKFont font, SKPaint ink)
        {
            var x = _map.Right - 22;
            var top = _map.Top + 10;
            using var halo = new SKPaint { Color = new SKColor(0xFF, 0xFF, 0xFF, 0xD0), IsAntialias = true };
            canvas.DrawRoundRect(new SKRect(x - 13, top - 2, x + 13, top + 46), 4, 4, halo);
            using var builder = new SKPathBuilder();
            builder.MoveTo(x, top + 16);
            builder.LineTo(x + 7, top + 40);
            builder.LineTo(x, top + 34);
            builder.LineTo(x - 7, top + 40);
            builder.Close();
            using var arrow = builder.Detach();
            canvas.DrawPath(arrow, ink);
            canvas.DrawText("N", x, top + 13, SKTextAlign.Center, font, ink);
        }

        private void DrawColourBar(SKCanvas canvas, SKRect bar, SKFont font, SKFont small, SKPaint ink, SKPaint line)
        {
            using var fill = new SKPaint();
            for (var y = 0; y < (int)bar.Height; y++)
            {
                var value = _max - (_max - _min) * y / (bar.Height - 1);
                var c = ColourOf(value)!.Value;
                fill.Color = new SKColor(c.R, c.G, c.B);
                canvas.DrawRect(bar.Left, bar.Top + y, bar.Width, 1.5f, fill);
            }
            canvas.DrawRect(bar, line);
            var ticks = _cyclic ? [0, 90, 180, 270, 360] : NiceTicks.Between(_min, _max, 6);
            foreach (var tick in ticks)
            {
                var y = (float)(bar.Bottom - (tick - _min) / (_max - _min) * bar.Height);
                canvas.DrawLine(bar.Right, y, bar.Right + 4, y, line);
                var label = _cyclic
                    ? $"{new[] { "N", "E", "S", "W", "N" }[(int)Math.Round(tick / 90)]} {tick:0}°"
                    : tick.ToString("G4", CultureInfo.InvariantCulture);
                canvas.DrawText(label, bar.Right + 7, y + 4, SKTextAlign.Left, small, ink);
            }
            canvas.DrawText(_data.Units, bar.Left, bar.Top - 8, SKTextAlign.Left, font, ink);
        }

        /// <summary>
        /// A round number of kilometres (1, 2 or 5 times a power of ten) near a quarter of the map's width, measured on
        /// the WGS 84 ellipsoid along the parallel of the map's middle; the label says at which latitude.
        /// </summary>
        private void DrawScaleBar(SKCanvas canvas, SKFont small, SKPaint ink, SKPaint line)
        {
            var latitude = (_raster.North + _raster.South) / 2;
            var metresAcross = GeodesicDistance.Metres(latitude, _raster.West, latitude, _raster.East);
            var kmPerPixel = metresAcross / 1000 / _map.Width;
            var km = NiceTicks.Round(kmPerPixel * _map.Width / 4);
            var length = (float)(km / kmPerPixel);
            var y = _map.Bottom + 38;
            var x = _map.Left;
            using var white = new SKPaint { Color = SKColors.White };
            using var black = new SKPaint { Color = Ink };
            canvas.DrawRect(x, y - 3, length / 2, 6, black);
            canvas.DrawRect(x + length / 2, y - 3, length / 2, 6, white);
            canvas.DrawRect(x, y - 3, length, 6, line);
            canvas.DrawText("0", x, y + 16, SKTextAlign.Center, small, ink);
            canvas.DrawText($"{km.ToString("G4", CultureInfo.InvariantCulture)} km", x + length, y + 16, SKTextAlign.Center, small, ink);
            canvas.DrawText($"scale at {Degrees(latitude, "N", "S")} (WGS 84)", x + length + 30, y + 4, SKTextAlign.Left, small, ink);
        }
    }

    private static SKTypeface Typeface() => SKTypeface.FromFamilyName(FontFamily) ?? SKTypeface.Default;

    private static string Capitalised(string text) => text.Length == 0 ? text : char.ToUpperInvariant(text[0]) + text[1..];

    private static IEnumerable<string> Wrap(string text, SKFont font, float width)
    {
        foreach (var paragraph in text.Split('\n'))
        {
            var current = "";
            foreach (var word in paragraph.Split(' ', StringSplitOptions.RemoveEmptyEntries))
            {
                var candidate = current.Length == 0 ? word : current + " " + word;
                if (font.MeasureText(candidate) > width && current.Length > 0)
                {
                    yield return current;
                    current = word;
                }
                else current = candidate;
            }
            if (current.Length > 0) yield return current;
        }
    }

    private static string Degrees(double value, string positive, string negative) =>
        $"{Math.Abs(value).ToString("0.##", CultureInfo.InvariantCulture)}°{(value >= 0 ? positive : negative)}";
}
