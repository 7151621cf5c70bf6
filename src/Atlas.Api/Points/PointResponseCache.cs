using System.Collections.Concurrent;

namespace Atlas.Api.Points;

/// <summary>
/// A finished point response: its bytes, media type, download name (CSV) and entity tag, and the same bytes
/// gzip-compressed once, when a client first asks for gzip (most answers to scripts' new windows are read once, by a
/// client that may not ask for it at all).
/// </summary>
public sealed class PointResponse(byte[] content, string contentType, string? fileName, string etag)
{
    private readonly Lazy<byte[]?> _gzipped = new(() => Gzip(content));

    public byte[] Content => content;

    public string ContentType => contentType;

    public string? FileName => fileName;

    public string ETag => etag;

    /// <summary>The content gzip-compressed, made on first use and kept; null when too small to gain.</summary>
    public byte[]? Gzipped => _gzipped.Value;

    // Compressed once, instead of by the compression middleware on every request: JSON and CSV of statistics shrink
    // about fivefold, and most HTTP clients ask for gzip.
    private static byte[]? Gzip(byte[] content)
    {
        if (content.Length < 1024) return null;
        using var buffer = new MemoryStream(content.Length / 4);
        using (var gzip = new GZipStream(buffer, CompressionLevel.Fastest, leaveOpen: true)) gzip.Write(content);
        return buffer.ToArray();
    }
}

/// <summary>What computing a point response gave: its content, or the problem that prevented it (never cached).</summary>
public sealed record PointOutcome(byte[]? Content, string ContentType, string? FileName, ProblemHttpResult? Problem)
{
    public static PointOutcome Failed(ProblemHttpResult problem) => new(null, "", null, problem);
}

/// <summary>
/// Finished point responses in memory, bounded by <see cref="AtlasApiOptions.PointCacheMegabytes"/>. A response is
/// keyed by everything that shapes it: the dataset and the stamps of its files and statistics (so a new ingest or
/// statistics pass is never answered from an older response), the cell, the window, the period, the parts and the
/// format. Consultants' scripts and the map page ask the same cells again and again; a repeated request then costs
/// a look-up instead of decoding and sorting the cell's whole series.
/// </summary>
public sealed class PointResponseCache : IDisposable
{
    private readonly MemoryCache? _cache;
    private readonly ConcurrentDictionary<string, Lazy<Task<(PointResponse?, ProblemHttpResult?)>>> _inFlight = new();

    public PointResponseCache(IOptions<AtlasApiOptions> options)
    {
        var megabytes = options.Value.PointCacheMegabytes;
        if (megabytes > 0) _cache = new MemoryCache(new MemoryCacheOptions { SizeLimit = megabytes * (1L << 20), CompactionPercentage = 0.25 });
    }

    /// <summary>
    /// The response for the key: the cached one, or the one <paramref name="compute"/> makes (then kept). Requests
    /// for a key already being computed wait for that computation instead of repeating it, so a burst of identical
    /// requests costs one computation. Returns the problem instead when the computation gave one.
    /// </summary>
    public async Task<(PointResponse? Response, ProblemHttpResult? Problem)> GetOrComputeAsync(string key, Func<Task<PointOutcome>> compute)
    {
        if (_cache is not null && _cache.TryGetValue(key, out PointResponse? found)) return (found, null);
        var shared = _inFlight.GetOrAdd(key, k => new Lazy<Task<(PointResponse?, ProblemHttpResult?)>>(async () =>
        {
            try
            {
                var outcome = await compute();
                return outcome.Content is null ? (null, outcome.Problem) : (Store(k, outcome.Content, outcome.ContentType, outcome.FileName), null);
            }
            finally { _inFlight.TryRemove(k, out _); }
        }));
        return await shared.Value;
    }

    private PointResponse Store(string key, byte[] content, string contentType, string? fileName)
    {
        var digest = SHA256.HashData(Encoding.UTF8.GetBytes(key));
        var response = new PointResponse(content, contentType, fileName, $"\"p-{Convert.ToHexStringLower(digest, 0, 12)}\"");
        _cache?.Set(key, response, new MemoryCacheEntryOptions
        {
            // The compressed form, made when first asked for, is counted ahead (about a quarter of the content, or less).
            Size = content.Length + content.Length / 4 + 2 * key.Length + 256,
            SlidingExpiration = TimeSpan.FromMinutes(30),
        });
        return response;
    }

    public void Dispose() => _cache?.Dispose();
}
