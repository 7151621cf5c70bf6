using System.Security;
using BitMiracle.LibTiff.Classic;

namespace Atlas.Api.Downloads;

/// <summary>
/// Writes a layer as a single-band Float32 GeoTIFF in EPSG:4326: tiles of 256 x 256, Deflate-compressed, with
/// internal overviews (halved until they fit one tile), GeoKeys (geographic WGS 84, pixel-is-area), the GDAL
/// nodata and metadata tags, and then the Cloud Optimised layout of <see cref="CogLayout"/>.
/// Empty pixels (NaN) are written as <see cref="NoData"/>.
/// </summary>
public static class GeoTiffWriter
{
    public const int TileSize = 256;
    public const float NoData = -9999f;

    private const TiffTag ModelPixelScale = (TiffTag)33550;
    private const TiffTag ModelTiepoint = (TiffTag)33922;
    private const TiffTag GeoKeyDirectory = (TiffTag)34735;
    private const TiffTag GdalMetadata = (TiffTag)42112;
    private const TiffTag GdalNoData = (TiffTag)42113;

    private static readonly Tiff.TiffExtendProc? PreviousExtender;

    static GeoTiffWriter()
    {
        // The GeoTIFF and GDAL tags are unknown to the TIFF library; register them once for every file it opens.
        PreviousExtender = Tiff.SetTagExtender(tiff =>
        {
            tiff.MergeFieldInfo(
            [
                new TiffFieldInfo(ModelPixelScale, -1, -1, TiffType.DOUBLE, FieldBit.Custom, true, true, "ModelPixelScale"),
                new TiffFieldInfo(ModelTiepoint, -1, -1, TiffType.DOUBLE, FieldBit.Custom, true, true, "ModelTiepoint"),
                new TiffFieldInfo(GeoKeyDirectory, -1, -1, TiffType.SHORT, FieldBit.Custom, true, true, "GeoKeyDirectory"),
                new TiffFieldInfo(GdalMetadata, -1, -1, TiffType.ASCII, FieldBit.Custom, true, false, "GDALMetadata"),
                new TiffFieldInfo(GdalNoData, -1, -1, TiffType.ASCII, FieldBit.Custom, true, false, "GDALNoData"),
            ], 5);
            PreviousExtender?.Invoke(tiff);
        });
    }

    public static byte[] Write(LayerRaster raster, GeoTiffMetadata metadata, DateTime generatedAtUtc)
    {
        var levels = new List<LayerRaster> { raster };
        while (levels[^1].Width > TileSize || levels[^1].Height > TileSize) levels.Add(levels[^1].Halve());

        using var stream = new MemoryStream();
        using (var tiff = Tiff.ClientOpen("layer.tif", "w", stream, new TiffStream()))
        {
            if (tiff is null) throw new InvalidOperationException("The TIFF library could not open an in-memory file.");
            for (var level = 0; level < levels.Count; level++)
            {
                WriteLevel(tiff, levels[level], level == 0, metadata, generatedAtUtc);
                if (!tiff.WriteDirectory()) throw new InvalidOperationException($"The TIFF library failed to write directory {level}.");
            }
        }
        return CogLayout.Rearrange(stream.ToArray());
    }

    private static void WriteLevel(Tiff tiff, LayerRaster level, bool main, GeoTiffMetadata metadata, DateTime generatedAtUtc)
    {
        if (!main) tiff.SetField(TiffTag.SUBFILETYPE, FileType.REDUCEDIMAGE);
        tiff.SetField(TiffTag.IMAGEWIDTH, level.Width);
        tiff.SetField(TiffTag.IMAGELENGTH, level.Height);
        tiff.SetField(TiffTag.BITSPERSAMPLE, 32);
        tiff.SetField(TiffTag.SAMPLESPERPIXEL, 1);
        tiff.SetField(TiffTag.SAMPLEFORMAT, SampleFormat.IEEEFP);
        tiff.SetField(TiffTag.PHOTOMETRIC, Photometric.MINISBLACK);
        tiff.SetField(TiffTag.PLANARCONFIG, PlanarConfig.CONTIG);
        tiff.SetField(TiffTag.COMPRESSION, Compression.ADOBE_DEFLATE);
        tiff.SetField(TiffTag.TILEWIDTH, TileSize);
        tiff.SetField(TiffTag.TILELENGTH, TileSize);
        tiff.SetField(GdalNoData, NoData.ToString(CultureInfo.InvariantCulture));
        if (main)
        {
            tiff.SetField(TiffTag.IMAGEDESCRIPTION, metadata.Description);
            tiff.SetField(TiffTag.SOFTWARE, $"atlas {Catalog.ProvenanceBuilder.SoftwareVersion}");
            tiff.SetField(TiffTag.DATETIME, generatedAtUtc.ToString("yyyy:MM:dd HH:mm:ss", CultureInfo.InvariantCulture));
            if (metadata.Licence is { } licence) tiff.SetField(TiffTag.COPYRIGHT, licence);
            tiff.SetField(ModelPixelScale, 3, new[] { level.PixelWidth, level.PixelHeight, 0.0 });
            tiff.SetField(ModelTiepoint, 6, new[] { 0.0, 0.0, 0.0, level.West, level.North, 0.0 });
            // GeoKey directory: version 1.1.0, 3 keys: model type geographic (2), raster pixel-is-area (1), WGS 84 (4326).
            tiff.SetField(GeoKeyDirectory, 16, new short[] { 1, 1, 0, 3, 1024, 0, 1, 2, 1025, 0, 1, 1, 2048, 0, 1, 4326 });
            tiff.SetField(GdalMetadata, MetadataXml(metadata));
        }

        // Tiles are Deflate-compressed here by the platform's zlib, several at once, and handed to the TIFF library
        // ready-made: its own managed Deflate took most of the time of a large layer. TIFF's Deflate (compression 8)
        // is the zlib stream format, which ZLibStream writes.
        var tilesAcross = (level.Width + TileSize - 1) / TileSize;
        var tilesDown = (level.Height + TileSize - 1) / TileSize;
        var compressed = new byte[tilesAcross * tilesDown][];
        Parallel.For(0, compressed.Length, t => compressed[t] = CompressedTile(level, t % tilesAcross, t / tilesAcross));
        for (var t = 0; t < compressed.Length; t++)
            if (tiff.WriteRawTile(t, compressed[t], compressed[t].Length) < 0)
                throw new InvalidOperationException($"The TIFF library failed to write tile {t % tilesAcross},{t / tilesAcross}.");
    }

    private static byte[] CompressedTile(LayerRaster level, int tx, int ty)
    {
        if (!BitConverter.IsLittleEndian) throw new PlatformNotSupportedException("GeoTIFF writing assumes a little-endian machine.");
        var tile = new float[TileSize * TileSize];
        for (var y = 0; y < TileSize; y++)
        for (var x = 0; x < TileSize; x++)
        {
            int column = tx * TileSize + x, row = ty * TileSize + y;
            var v = column < level.Width && row < level.Height ? level[column, row] : float.NaN;
            tile[y * TileSize + x] = float.IsNaN(v) ? NoData : v;
        }
        using var output = new MemoryStream();
        using (var zlib = new ZLibStream(output, CompressionLevel.Optimal, leaveOpen: true))
            zlib.Write(System.Runtime.InteropServices.MemoryMarshal.AsBytes(tile.AsSpan()));
        return output.ToArray();
    }

    private static string MetadataXml(GeoTiffMetadata metadata)
    {
        var xml = new StringBuilder("<GDALMetadata>");
        foreach (var (key, value) in metadata.Items)
            xml.Append("<Item name=\"").Append(SecurityElement.Escape(key)).Append("\">").Append(SecurityElement.Escape(value)).Append("</Item>");
        xml.Append("<Item name=\"DESCRIPTION\" sample=\"0\" role=\"description\">").Append(SecurityElement.Escape(metadata.BandName)).Append("</Item>");
        xml.Append("<Item name=\"UNITTYPE\" sample=\"0\" role=\"unittype\">").Append(SecurityElement.Escape(metadata.Units)).Append("</Item>");
        xml.Append("</GDALMetadata>");
        return xml.ToString();
    }
}
