using System.Diagnostics;
using Atlas.Ingest.Ingestion;

namespace Atlas.Ingest.Tests.Ingestion;

public class FileChecksumTests
{
    // The provenance checksum equals what GNU coreutils' sha256sum prints for the same bytes: an empty file, a small one,
    // and one of 150 MB read in many buffers' worth, the last one partial.
    [Theory]
    [InlineData(0)]
    [InlineData(1_000)]
    [InlineData(150_000_003)]
    public void ChecksumEqualsSha256sum(long length)
    {
        var path = Path.Combine(Path.GetTempPath(), $"atlas-checksum-{Guid.NewGuid():N}.bin");
        try
        {
            using (var stream = File.Create(path))
            {
                var random = new Random(3);
                var block = new byte[1 << 20];
                for (long written = 0; written < length; written += block.Length)
                {
                    random.NextBytes(block);
                    stream.Write(block, 0, (int)Math.Min(block.Length, length - written));
                }
            }
            using var process = Process.Start(new ProcessStartInfo("sha256sum", [path]) { RedirectStandardOutput = true })!;
            string expected = process.StandardOutput.ReadToEnd().Split(' ')[0];
            process.WaitForExit();
            Assert.Equal(expected, FileChecksum.Sha256(path));
        }
        finally
        {
            File.Delete(path);
        }
    }
}
