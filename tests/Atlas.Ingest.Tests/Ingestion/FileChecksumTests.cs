using Atlas.Ingest.Ingestion;

namespace Atlas.Ingest.Tests.Ingestion;

public class FileChecksumTests
{
    // The official BLAKE3 test vectors (github.com/BLAKE3-team/BLAKE3, test_vectors/test_vectors.json, the first 32 bytes
    // of "hash"): inputs of the repeating bytes 0, 1, ..., 250 across the chunk (1,024 bytes) and tree boundaries, read
    // here in buffers of 1,000 bytes so that every read boundary falls inside a chunk, and in the default buffer.
    [Theory]
    [InlineData(0, "af1349b9f5f9a1a6a0404dea36dcc9499bcb25c9adc112b7cc9a93cae41f3262")]
    [InlineData(1, "2d3adedff11b61f14c886e35afa036736dcd87a74d27b5c1510225d0f592e213")]
    [InlineData(1023, "10108970eeda3eb932baac1428c7a2163b0e924c9a9e25b35bba72b28f70bd11")]
    [InlineData(1024, "42214739f095a406f3fc83deb889744ac00df831c10daa55189b5d121c855af7")]
    [InlineData(1025, "d00278ae47eb27b34faecf67b4fe263f82d5412916c1ffd97c8cb7fb814b8444")]
    [InlineData(2048, "e776b6028c7cd22a4d0ba182a8bf62205d2ef576467e838ed6f2529b85fba24a")]
    [InlineData(3073, "7124b49501012f81cc7f11ca069ec9226cecb8a2c850cfe644e327d22d3e1cd3")]
    [InlineData(8193, "bab6c09cb8ce8cf459261398d2e7aef35700bf488116ceb94a36d0f5f1b7bc3b")]
    [InlineData(31744, "62b6960e1a44bcc1eb1a611a8d6235b6b4b78f32e7abc4fb4c6cdcce94895c47")]
    [InlineData(102400, "bc3e3d41a1146b069abffad3c0d44860cf664390afce4d9661f7902e7943e085")]
    public void Blake3MatchesTheOfficialTestVectors(int length, string expected)
    {
        var path = TempFile();
        try
        {
            File.WriteAllBytes(path, Enumerable.Range(0, length).Select(i => (byte)(i % 251)).ToArray());
            Assert.Equal("blake3:" + expected, FileChecksum.Of(path, FileChecksum.Blake3, 1_000));
            Assert.Equal("blake3:" + expected, FileChecksum.Of(path));
        }
        finally
        {
            File.Delete(path);
        }
    }

    // Both checksums equal what the reference programs print for the same bytes: the BLAKE3 team's b3sum and GNU
    // coreutils' sha256sum. An empty file, a small one, and one of 150 MB read in many buffers' worth, the last partial.
    [Theory]
    [InlineData(0)]
    [InlineData(1_000)]
    [InlineData(150_000_003)]
    public void ChecksumsEqualB3sumAndSha256sum(long length)
    {
        var path = TempFile();
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
            Assert.Equal("blake3:" + Printed("b3sum", path), FileChecksum.Of(path));
            Assert.Equal("sha256:" + Printed("sha256sum", path), FileChecksum.Of(path, FileChecksum.Sha256));
        }
        finally
        {
            File.Delete(path);
        }
    }

    [Fact]
    public void AnUnknownAlgorithmIsNamed()
    {
        var error = Assert.Throws<ArgumentException>(() => FileChecksum.Of("/dev/null", "md5"));
        Assert.Contains("'md5'", error.Message);
    }

    /// <summary>The digest a checksum program prints for <paramref name="path"/> (its first word).</summary>
    internal static string Printed(string program, string path) => Atlas.TestSupport.ExternalTool.Run(program, path).Split(' ')[0];

    private static string TempFile() => Path.Combine(Path.GetTempPath(), $"atlas-checksum-{Guid.NewGuid():N}.bin");
}
