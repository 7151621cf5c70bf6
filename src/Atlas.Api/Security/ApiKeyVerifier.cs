namespace Atlas.Api.Security;

/// <summary>
/// Checks an API key against the configured SHA-256 digests. The key is hashed and compared with every digest in
/// constant time (no early exit), so neither the match nor its position leaks through timing.
/// </summary>
public sealed class ApiKeyVerifier
{
    public const string HeaderName = "X-Api-Key";

    private readonly byte[][] _digests;

    public ApiKeyVerifier(IOptions<AtlasApiOptions> options)
    {
        _digests = options.Value.ApiKeySha256.Where(d => !string.IsNullOrWhiteSpace(d)).Select(d => Convert.FromHexString(d.Trim())).ToArray();
    }

    public bool HasKeys => _digests.Length > 0;

    public bool Accepts(string? key)
    {
        if (string.IsNullOrEmpty(key)) return false;
        Span<byte> digest = stackalloc byte[SHA256.HashSizeInBytes];
        SHA256.HashData(Encoding.UTF8.GetBytes(key), digest);
        var match = false;
        foreach (var known in _digests) match |= CryptographicOperations.FixedTimeEquals(digest, known);
        return match;
    }

    /// <summary>The digest of a key as configured: 64 lower-case hex digits.</summary>
    public static string DigestOf(string key) => Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(key)));
}
