using System.IO.MemoryMappedFiles;
using System.Security.Cryptography;

namespace Atlas.Ingest.Ingestion;

/// <summary>
/// The SHA-256 of a file's bytes, as provenance records it. The file is mapped into memory a window at a time and hashed
/// where the page cache holds it, with no copy into a buffer; a window is unmapped before the next, so the mapping never
/// holds more than one window of the file.
/// </summary>
public static class FileChecksum
{
    private const long Window = 64L << 20;

    /// <summary>The lower-case hexadecimal SHA-256 of the file at <paramref name="path"/>.</summary>
    public static unsafe string Sha256(string path)
    {
        long length = new FileInfo(path).Length;
        if (length == 0) return Convert.ToHexStringLower(SHA256.HashData(ReadOnlySpan<byte>.Empty));
        using var hash = IncrementalHash.CreateHash(HashAlgorithmName.SHA256);
        using (var map = MemoryMappedFile.CreateFromFile(path, FileMode.Open, null, 0, MemoryMappedFileAccess.Read))
        {
            for (long at = 0; at < length; at += Window)
            {
                long count = Math.Min(Window, length - at);
                using var view = map.CreateViewAccessor(at, count, MemoryMappedFileAccess.Read);
                byte* start = null;
                view.SafeMemoryMappedViewHandle.AcquirePointer(ref start);
                try
                {
                    hash.AppendData(new ReadOnlySpan<byte>(start + view.PointerOffset, (int)count));
                }
                finally
                {
                    view.SafeMemoryMappedViewHandle.ReleasePointer();
                }
            }
        }
        return Convert.ToHexStringLower(hash.GetHashAndReset());
    }
}
