using System.Buffers.Binary;
using System.IO.Hashing;

namespace Atlas.Api.Downloads;

/// <summary>
/// Adds international text chunks (iTXt, PNG specification, third edition, section 11.3.3.4; uncompressed, UTF-8,
/// no language tag) right after the IHDR chunk of a PNG, where every reader finds them before the image data.
/// </summary>
public static class PngTextChunks
{
    private static readonly byte[] Signature = [0x89, (byte)'P', (byte)'N', (byte)'G', 0x0D, 0x0A, 0x1A, 0x0A];

    public static byte[] Add(byte[] png, IEnumerable<KeyValuePair<string, string>> texts)
    {
        if (png.Length < 33 || !png.AsSpan(0, 8).SequenceEqual(Signature) || Encoding.ASCII.GetString(png, 12, 4) != "IHDR")
            throw new ArgumentException("Not a PNG starting with its IHDR chunk.", nameof(png));
        var afterHeader = 8 + 12 + BinaryPrimitives.ReadInt32BigEndian(png.AsSpan(8, 4));
        using var output = new MemoryStream(png.Length + 4096);
        output.Write(png, 0, afterHeader);
        foreach (var (keyword, text) in texts) WriteChunk(output, "iTXt", Payload(keyword, text));
        output.Write(png, afterHeader, png.Length - afterHeader);
        return output.ToArray();
    }

    // Keyword (1-79 Latin-1 characters), null, compression flag 0, method 0, empty language tag, null, empty
    // translated keyword, null, then the text in UTF-8.
    private static byte[] Payload(string keyword, string text)
    {
        if (keyword.Length is < 1 or > 79 || keyword.Any(c => c < 32 || c > 255))
            throw new ArgumentException($"'{keyword}' is not a PNG text keyword (1-79 Latin-1 characters).", nameof(keyword));
        using var payload = new MemoryStream();
        payload.Write(Encoding.Latin1.GetBytes(keyword));
        payload.Write([0, 0, 0, 0, 0]);
        payload.Write(Encoding.UTF8.GetBytes(text));
        return payload.ToArray();
    }

    private static void WriteChunk(Stream output, string type, byte[] data)
    {
        Span<byte> number = stackalloc byte[4];
        BinaryPrimitives.WriteInt32BigEndian(number, data.Length);
        output.Write(number);
        var typeBytes = Encoding.ASCII.GetBytes(type);
        output.Write(typeBytes);
        output.Write(data);
        var crc = new Crc32();
        crc.Append(typeBytes);
        crc.Append(data);
        BinaryPrimitives.WriteUInt32BigEndian(number, crc.GetCurrentHashAsUInt32());
        output.Write(number);
    }
}
