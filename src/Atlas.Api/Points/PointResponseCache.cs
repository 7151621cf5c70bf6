using System.Security.Cryptography;
using System.Text;
using Atlas.Api.Infrastructure;
using Microsoft.Extensions.Caching.Memory;
using Microsoft.Extensions.Options;

namespace Atlas.Api.Points;

/// <summary>A finished point response: its bytes, media type, download name (CSV) and entity tag.</summary>
public sealed record PointResponse(byte[] Content, string ContentType, string? FileName, string ETag);

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

    public PointResponseCache(IOptions<AtlasApiOptions> options)
    {
        var megabytes = options.Value.PointCacheMegabytes;
        if (megabytes > 0) _cache = new MemoryCache(new MemoryCacheOptions { SizeLimit = megabytes * (1L << 20), CompactionPercentage = 0.25 });
    }

    /// <summary>The cached response for the key, or null.</summary>
    public PointResponse? Find(string key) => _cache is not null && _cache.TryGetValue(key, out PointResponse? found) ? found : null;

    /// <summary>Makes a response (with its entity tag, a digest of the key) and keeps it when the cache is on.</summary>
    public PointResponse Store(string key, byte[] content, string contentType, string? fileName)
    {
        var digest = SHA256.HashData(Encoding.UTF8.GetBytes(key));
        var response = new PointResponse(content, contentType, fileName, $"\"p-{Convert.ToHexStringLower(digest, 0, 12)}\"");
        _cache?.Set(key, response, new MemoryCacheEntryOptions
        {
            Size = content.Length + 2 * key.Length + 256,
            SlidingExpiration = TimeSpan.FromMinutes(30),
        });
        return response;
    }

    public void Dispose() => _cache?.Dispose();
}
