using System.ComponentModel.DataAnnotations;

namespace Atlas.Api.Infrastructure;

/// <summary>
/// Settings of the HTTP API, bound from the configuration section <c>AtlasApiOptions</c> and checked at start-up.
/// </summary>
public sealed class AtlasApiOptions : IValidatableObject
{
    /// <summary>
    /// The farthest a point request may lie from the nearest wet cell, km. When unset, the limit is
    /// <see cref="PointMaxDistanceGridSpacings"/> times the dataset's typical cell spacing.
    /// </summary>
    [Range(0.001, 10_000)]
    public double? PointMaxDistanceKm { get; set; }

    /// <summary>The point distance limit in typical cell spacings, used when <see cref="PointMaxDistanceKm"/> is unset.</summary>
    [Range(0.5, 100)]
    public double PointMaxDistanceGridSpacings { get; set; } = 2.0;

    /// <summary>The longest time range one series request may cover, in years (whole calendar years counted).</summary>
    [Range(1, 200)]
    public int SeriesMaxYearsPerRequest { get; set; } = 10;

    /// <summary>The largest polygon an area request may send, km2 on the spheroid.</summary>
    [Range(1, 1e9)]
    public double AreaMaxSquareKilometres { get; set; } = 250_000;

    /// <summary>The most vertices an area polygon may have.</summary>
    [Range(4, 1_000_000)]
    public int AreaMaxVertices { get; set; } = 20_000;

    /// <summary>The largest request body accepted, bytes.</summary>
    [Range(1024, 1L << 30)]
    public long MaxRequestBodyBytes { get; set; } = 1L << 20;

    /// <summary>Requests per client address per minute on the expensive endpoints (point, series, layers, area, screen).</summary>
    [Range(1, 1_000_000)]
    public int ExpensiveRequestsPerMinute { get; set; } = 600;

    /// <summary>
    /// SHA-256 digests (64 hex digits) of the API keys accepted by write endpoints. Keys themselves are never
    /// configured; compute a digest with <c>printf %s "$KEY" | sha256sum</c>. Empty: write endpoints are refused.
    /// </summary>
    public string[] ApiKeySha256 { get; set; } = [];

    /// <summary>The folder served at <c>/</c>; unset: the checkout's <c>wwwroot</c> folder.</summary>
    public string? WebRootPath { get; set; }

    /// <summary>Origins allowed by CORS. Empty (the default): no CORS headers are sent at all.</summary>
    public string[] CorsOrigins { get; set; } = [];

    /// <summary>The widest raster a layer download is drawn at, pixels per side (mesh and curvilinear datasets).</summary>
    [Range(16, 16384)]
    public int LayerMaxPixels { get; set; } = 2048;

    /// <summary>Seconds a client may keep a layer download before revalidating it with its ETag.</summary>
    [Range(0, 31_536_000)]
    public int LayerCacheSeconds { get; set; } = 3600;

    /// <summary>
    /// Datasets with at most this many wet cells keep them in memory for nearest-cell look-ups (about 100 bytes a
    /// cell); larger ones are answered by the database's spatial index. 0 keeps none in memory.
    /// </summary>
    [Range(0, 100_000_000)]
    public int PointIndexMaxCells { get; set; } = 5_000_000;

    /// <summary>Memory for finished point responses (statistics by cell, window and format), MB; 0 turns the cache off.</summary>
    [Range(0, 1 << 20)]
    public int PointCacheMegabytes { get; set; } = 256;

    /// <summary>
    /// Checked at start-up: each configured digest must be 64 hex digits (blank entries are ignored), each CORS origin
    /// a bare http(s) origin, and a configured web root must exist.
    /// </summary>
    public IEnumerable<ValidationResult> Validate(ValidationContext validationContext)
    {
        foreach (var origin in CorsOrigins)
            if (!Uri.TryCreate(origin, UriKind.Absolute, out var uri) || uri.Scheme is not ("http" or "https") || uri.PathAndQuery != "/" || origin.EndsWith('/'))
                yield return new ValidationResult(
                    $"AtlasApiOptions:CorsOrigins holds '{origin}', which is not an origin: give scheme, host and port only, such as https://maps.example.org",
                    [nameof(CorsOrigins)]);
        if (!string.IsNullOrWhiteSpace(WebRootPath) && !Directory.Exists(WebRootPath))
            yield return new ValidationResult(
                $"AtlasApiOptions:WebRootPath is '{WebRootPath}', which is not a folder; point it at the map page (the checkout's wwwroot) or leave it unset",
                [nameof(WebRootPath)]);
        foreach (var digest in ApiKeySha256.Where(d => !string.IsNullOrWhiteSpace(d)))
            if (digest.Trim().Length != 64 || !digest.Trim().All(Uri.IsHexDigit))
                yield return new ValidationResult(
                    $"AtlasApiOptions:ApiKeySha256 holds '{(digest.Length <= 8 ? digest : digest[..8] + "...")}', which is not a SHA-256 digest (64 hex digits). " +
                    "Configure digests, never keys: printf %s \"$KEY\" | sha256sum", [nameof(ApiKeySha256)]);
    }
}
