namespace Atlas.Hindcast;

/// <summary>How a variable's data are laid out on disk.</summary>
public enum NetCdfStorage { Contiguous, Chunked, Compact }

/// <summary>Metadata of one variable of a netCDF file (root group).</summary>
public sealed class NetCdfVariable
{
    private readonly Dictionary<string, NetCdfAttribute> _attributes;

    internal NetCdfVariable(int id, string name, NetCdfType type, IReadOnlyList<NetCdfDimension> dimensions,
        IReadOnlyList<NetCdfAttribute> attributes, NetCdfStorage storage, long[]? chunkSizes, int deflateLevel, bool shuffle)
    {
        Id = id;
        Name = name;
        Type = type;
        Dimensions = dimensions;
        Attributes = attributes;
        _attributes = attributes.ToDictionary(a => a.Name, StringComparer.Ordinal);
        Storage = storage;
        ChunkSizes = chunkSizes;
        DeflateLevel = deflateLevel;
        Shuffle = shuffle;
    }

    public int Id { get; }
    public string Name { get; }
    public NetCdfType Type { get; }
    public IReadOnlyList<NetCdfDimension> Dimensions { get; }
    public IReadOnlyList<NetCdfAttribute> Attributes { get; }
    public NetCdfStorage Storage { get; }

    /// <summary>Chunk shape for chunked (NetCDF-4) variables, otherwise null.</summary>
    public long[]? ChunkSizes { get; }

    /// <summary>zlib deflate level, 0 when not compressed.</summary>
    public int DeflateLevel { get; }

    public bool Shuffle { get; }

    public int Rank => Dimensions.Count;

    /// <summary>Current length of each dimension (unlimited dimensions at their current length).</summary>
    public long[] Shape => Dimensions.Select(d => d.Length).ToArray();

    /// <summary>Number of values held.</summary>
    public long Length => Dimensions.Aggregate(1L, (n, d) => n * d.Length);

    public NetCdfAttribute? Attribute(string name) => _attributes.GetValueOrDefault(name);

    /// <summary>The text of a char/string attribute, trimmed; null when absent or numeric.</summary>
    public string? TextAttribute(string name) => Attribute(name)?.Text?.Trim();

    /// <summary>The first value of a numeric attribute, or null when absent or text.</summary>
    public double? NumberAttribute(string name) =>
        Attribute(name) is { IsText: false, Values.Count: > 0 } a ? a.Values[0] : null;

    public override string ToString() => $"{Type} {Name}({string.Join(", ", Dimensions.Select(d => d.Name))})";
}
