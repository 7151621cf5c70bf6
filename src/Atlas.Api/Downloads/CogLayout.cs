using System.Buffers.Binary;

namespace Atlas.Api.Downloads;

/// <summary>
/// Rearranges a little-endian classic TIFF (every image tiled) into the Cloud Optimised GeoTIFF layout: the header,
/// GDAL's structural-metadata block, then every IFD with its tag values (main image first, then overviews by
/// decreasing size), then the tile data of the smallest overview first and of the main image last, each tile
/// preceded by its byte count and followed by a repeat of its last four bytes (so readers can check they fetched
/// whole tiles). Tag values are copied unchanged; only the tile offsets and byte counts are recomputed.
/// </summary>
public static class CogLayout
{
    private const ushort TileOffsets = 324;
    private const ushort TileByteCounts = 325;
    private const ushort TypeLong = 4;

    private const string StructuralMetadata =
        "LAYOUT=IFDS_BEFORE_DATA\nBLOCK_ORDER=ROW_MAJOR\nBLOCK_LEADER=SIZE_AS_UINT4\nBLOCK_TRAILER=LAST_4_BYTES_REPEATED\nKNOWN_INCOMPATIBLE_EDITION=NO\n ";

    private sealed record Entry(ushort Tag, ushort Type, uint Count, byte[] Value);

    private sealed record Directory(List<Entry> Entries, List<byte[]> Tiles);

    public static byte[] Rearrange(byte[] tiff)
    {
        if (tiff.Length < 8 || tiff[0] != 'I' || tiff[1] != 'I' || BinaryPrimitives.ReadUInt16LittleEndian(tiff.AsSpan(2)) != 42)
            throw new ArgumentException("Expected a little-endian classic TIFF.", nameof(tiff));
        var directories = Read(tiff);

        var ghost = Encoding.ASCII.GetBytes($"GDAL_STRUCTURAL_METADATA_SIZE={StructuralMetadata.Length:D6} bytes\n{StructuralMetadata}");
        long position = 8 + ghost.Length;
        position += position % 2;

        // Lay out the IFDs: each is its entry table, then its out-of-line values (word aligned).
        var ifdOffsets = new long[directories.Count];
        for (var d = 0; d < directories.Count; d++)
        {
            ifdOffsets[d] = position;
            var entries = directories[d].Entries;
            position += 2 + 12L * entries.Count + 4;
            foreach (var entry in entries)
                if (entry.Value.Length > 4) position += entry.Value.Length + entry.Value.Length % 2;
        }

        // Lay out the tiles, smallest overview first: leader (4), data, trailer (4).
        var tileOffsets = new uint[directories.Count][];
        for (var d = directories.Count - 1; d >= 0; d--)
        {
            var tiles = directories[d].Tiles;
            tileOffsets[d] = new uint[tiles.Count];
            for (var t = 0; t < tiles.Count; t++)
            {
                position += 4;
                tileOffsets[d][t] = checked((uint)position);
                position += tiles[t].Length + (tiles[t].Length >= 4 ? 4 : 0);
            }
        }
        if (position > uint.MaxValue) throw new InvalidOperationException("The GeoTIFF would exceed 4 GiB; BigTIFF is not written.");

        var output = new byte[position];
        var span = output.AsSpan();
        "II"u8.CopyTo(span);
        BinaryPrimitives.WriteUInt16LittleEndian(span[2..], 42);
        BinaryPrimitives.WriteUInt32LittleEndian(span[4..], (uint)ifdOffsets[0]);
        ghost.CopyTo(span[8..]);

        for (var d = 0; d < directories.Count; d++)
        {
            var entries = directories[d].Entries
                .Select(e => e.Tag switch
                {
                    TileOffsets => LongArray(e.Tag, tileOffsets[d]),
                    TileByteCounts => LongArray(e.Tag, directories[d].Tiles.Select(t => (uint)t.Length).ToArray()),
                    _ => e,
                })
                .ToList();
            var at = (int)ifdOffsets[d];
            BinaryPrimitives.WriteUInt16LittleEndian(span[at..], (ushort)entries.Count);
            var valueAt = at + 2 + 12 * entries.Count + 4;
            for (var i = 0; i < entries.Count; i++)
            {
                var e = entries[i];
                var slot = span[(at + 2 + 12 * i)..];
                BinaryPrimitives.WriteUInt16LittleEndian(slot, e.Tag);
                BinaryPrimitives.WriteUInt16LittleEndian(slot[2..], e.Type);
                BinaryPrimitives.WriteUInt32LittleEndian(slot[4..], e.Count);
                if (e.Value.Length <= 4) e.Value.CopyTo(slot[8..]);
                else
                {
                    BinaryPrimitives.WriteUInt32LittleEndian(slot[8..], (uint)valueAt);
                    e.Value.CopyTo(span[valueAt..]);
                    valueAt += e.Value.Length + e.Value.Length % 2;
                }
            }
            var next = d + 1 < directories.Count ? (uint)ifdOffsets[d + 1] : 0u;
            BinaryPrimitives.WriteUInt32LittleEndian(span[(at + 2 + 12 * entries.Count)..], next);
        }

        for (var d = 0; d < directories.Count; d++)
        for (var t = 0; t < directories[d].Tiles.Count; t++)
        {
            var tile = directories[d].Tiles[t];
            var at = (int)tileOffsets[d][t];
            BinaryPrimitives.WriteUInt32LittleEndian(span[(at - 4)..], (uint)tile.Length);
            tile.CopyTo(span[at..]);
            if (tile.Length >= 4) tile.AsSpan(tile.Length - 4).CopyTo(span[(at + tile.Length)..]);
        }
        return output;
    }

    private static List<Directory> Read(byte[] tiff)
    {
        var span = tiff.AsSpan();
        var directories = new List<Directory>();
        var offset = BinaryPrimitives.ReadUInt32LittleEndian(span[4..]);
        while (offset != 0)
        {
            if (directories.Count > 64) throw new ArgumentException("The TIFF has too many directories (a loop?).", nameof(tiff));
            var count = BinaryPrimitives.ReadUInt16LittleEndian(span[(int)offset..]);
            var entries = new List<Entry>(count);
            for (var i = 0; i < count; i++)
            {
                var slot = span[((int)offset + 2 + 12 * i)..];
                var tag = BinaryPrimitives.ReadUInt16LittleEndian(slot);
                var type = BinaryPrimitives.ReadUInt16LittleEndian(slot[2..]);
                var n = BinaryPrimitives.ReadUInt32LittleEndian(slot[4..]);
                var length = checked((int)(n * SizeOf(type)));
                var value = length <= 4 ? slot.Slice(8, 4).ToArray() : span.Slice((int)BinaryPrimitives.ReadUInt32LittleEndian(slot[8..]), length).ToArray();
                entries.Add(new Entry(tag, type, n, value));
            }
            var offsets = Numbers(entries.Single(e => e.Tag == TileOffsets));
            var counts = Numbers(entries.Single(e => e.Tag == TileByteCounts));
            var tiles = new List<byte[]>(offsets.Length);
            for (var t = 0; t < offsets.Length; t++) tiles.Add(span.Slice((int)offsets[t], (int)counts[t]).ToArray());
            directories.Add(new Directory(entries, tiles));
            offset = BinaryPrimitives.ReadUInt32LittleEndian(span[((int)offset + 2 + 12 * count)..]);
        }
        return directories;
    }

    private static uint[] Numbers(Entry entry)
    {
        var values = new uint[entry.Count];
        for (var i = 0; i < values.Length; i++)
            values[i] = entry.Type == 3
                ? BinaryPrimitives.ReadUInt16LittleEndian(entry.Value.AsSpan(2 * i))
                : BinaryPrimitives.ReadUInt32LittleEndian(entry.Value.AsSpan(4 * i));
        return values;
    }

    private static Entry LongArray(ushort tag, uint[] values)
    {
        var bytes = new byte[Math.Max(4, 4 * values.Length)];
        for (var i = 0; i < values.Length; i++) BinaryPrimitives.WriteUInt32LittleEndian(bytes.AsSpan(4 * i), values[i]);
        return new Entry(tag, TypeLong, (uint)values.Length, values.Length == 1 ? bytes[..4] : bytes);
    }

    private static int SizeOf(ushort type) => type switch
    {
        1 or 2 or 6 or 7 => 1,
        3 or 8 => 2,
        4 or 9 or 11 or 13 => 4,
        5 or 10 or 12 => 8,
        _ => throw new ArgumentException($"Unsupported TIFF field type {type}."),
    };
}
