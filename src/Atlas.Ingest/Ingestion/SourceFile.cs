using System.Security.Cryptography;
using Atlas.Hindcast;

namespace Atlas.Ingest.Ingestion;

/// <summary>An opened hindcast file with its checksum and time line (Unix seconds).</summary>
public sealed class SourceFile : IDisposable
{
    private SourceFile(HindcastFile file, string sha256, long sizeBytes, IReadOnlyDictionary<string, string> attributes)
    {
        Attributes = attributes;
        File = file;
        Sha256 = sha256;
        SizeBytes = sizeBytes;
        Times = file.TimesUtc.Select(t => new DateTimeOffset(DateTime.SpecifyKind(t, DateTimeKind.Utc)).ToUnixTimeSeconds()).ToArray();
    }

    public HindcastFile File { get; }
    public string Name => Path.GetFileName(File.Path);
    public string Sha256 { get; }
    public long SizeBytes { get; }
    public long[] Times { get; }

    /// <summary>The file's global text attributes (title, institution, source, history, license, ...).</summary>
    public IReadOnlyDictionary<string, string> Attributes { get; }

    public string? Attribute(string name) => Attributes.GetValueOrDefault(name);

    /// <summary>Opens and decodes a file, and checksums its bytes (SHA-256, streamed).</summary>
    public static SourceFile Open(string path, VariableMapping? mapping)
    {
        if (!System.IO.File.Exists(path)) throw new IngestException($"{path}: no such file.");
        string sha;
        using (var stream = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read, 1 << 20))
            sha = Convert.ToHexStringLower(SHA256.HashData(stream));
        var file = HindcastFile.Open(path, mapping);
        Dictionary<string, string> attributes;
        using (var raw = NetCdfFile.Open(path))
            attributes = raw.GlobalAttributes.Where(a => a.IsText).ToDictionary(a => a.Name, a => a.Text!, StringComparer.OrdinalIgnoreCase);
        if (file.TimesUtc.Count == 0)
        {
            file.Dispose();
            throw new IngestException($"{Path.GetFileName(path)}: the time axis is empty; there is nothing to load.");
        }
        return new SourceFile(file, sha, new FileInfo(path).Length, attributes);
    }

    public void Dispose() => File.Dispose();
}
