using System.Security.Cryptography;
using Atlas.Hindcast;

namespace Atlas.Ingest.Ingestion;

/// <summary>An opened hindcast file with its checksum and time line (Unix seconds).</summary>
public sealed class SourceFile : IDisposable
{
    private readonly VariableMapping? _mapping;
    private HindcastFile? _file;

    private SourceFile(HindcastFile file, VariableMapping? mapping, string sha256, long sizeBytes, IReadOnlyDictionary<string, string> attributes,
        DepthLookalike? depthLookalike)
    {
        Attributes = attributes;
        DepthLookalike = depthLookalike;
        Sources = WaveParameterGroups.HindcastFields.Where(file.Has).ToDictionary(v => v, v =>
        {
            var resolved = file.Source(v)!;
            return new VariableSource(resolved.Name, resolved.HowFound, resolved.DescribeConversion(file.DecoderOf(v)!));
        });
        _file = file;
        _mapping = mapping;
        Path = file.Path;
        Grid = file.Grid;
        Variables = WaveParameterGroups.HindcastFields.Where(file.Has).ToHashSet();
        Sha256 = sha256;
        SizeBytes = sizeBytes;
        Times = file.TimesUtc.Select(t => new DateTimeOffset(DateTime.SpecifyKind(t, DateTimeKind.Utc)).ToUnixTimeSeconds()).ToArray();
    }

    /// <summary>
    /// The open file, opened again on demand after <see cref="Release"/>. Files are released as soon as the ingest
    /// is done with them, so that netCDF-C's per-variable chunk caches of many files never pile up in memory.
    /// </summary>
    public HindcastFile File => _file ??= HindcastFile.Open(Path, _mapping);

    public string Path { get; }
    public HindcastGrid Grid { get; }
    public IReadOnlySet<WaveParameter> Variables { get; }
    public bool Has(WaveParameter variable) => Variables.Contains(variable);
    public string Name => System.IO.Path.GetFileName(Path);
    public string Sha256 { get; }
    public long SizeBytes { get; }
    public long[] Times { get; }

    /// <summary>The file's global text attributes (title, institution, source, history, license, ...).</summary>
    public IReadOnlyDictionary<string, string> Attributes { get; }

    public string? Attribute(string name) => Attributes.GetValueOrDefault(name);

    /// <summary>The file variable behind each wave variable the file has, how it was found and how it is converted.</summary>
    public IReadOnlyDictionary<WaveParameter, VariableSource> Sources { get; }

    /// <summary>A variable named like the water depth that was not taken for it, and why; null when there is none.</summary>
    public DepthLookalike? DepthLookalike { get; }

    /// <summary>Opens and decodes a file, and checksums its bytes (SHA-256, streamed).</summary>
    public static SourceFile Open(string path, VariableMapping? mapping)
    {
        if (!System.IO.File.Exists(path)) throw new IngestException($"{path}: no such file.");
        string sha;
        using (var stream = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read, 1 << 20))
            sha = Convert.ToHexStringLower(SHA256.HashData(stream));
        var file = HindcastFile.Open(path, mapping);
        Dictionary<string, string> attributes;
        DepthLookalike? lookalike = null;
        using (var raw = NetCdfFile.Open(path))
        {
            attributes = raw.GlobalAttributes.Where(a => a.IsText).ToDictionary(a => a.Name, a => a.Text!, StringComparer.OrdinalIgnoreCase);
            if (!file.Has(WaveParameter.Depth)) lookalike = CfDecoder.WaterDepthLookalike(raw);
        }
        if (file.TimesUtc.Count == 0)
        {
            file.Dispose();
            throw new IngestException($"{System.IO.Path.GetFileName(path)}: the time axis is empty; there is nothing to load.");
        }
        return new SourceFile(file, mapping, sha, new FileInfo(path).Length, attributes, lookalike);
    }

    /// <summary>Closes the file (and frees its caches) until it is next needed.</summary>
    public void Release()
    {
        _file?.Dispose();
        _file = null;
    }

    public void Dispose() => Release();
}
