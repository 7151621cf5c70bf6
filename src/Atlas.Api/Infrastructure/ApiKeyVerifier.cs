using System.Security.Cryptography;
using System.Text;
using Microsoft.Extensions.Options;

namespace Atlas.Api.Infrastructure;

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
        _digests = options.Value.ApiKeySha256.Select(ParseDigest).ToArray();
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

    private static byte[] ParseDigest(string hex)
    {
        var text = hex.Trim();
        if (text.Length != 64 || !text.All(Uri.IsHexDigit))
            throw new OptionsValidationException(nameof(AtlasApiOptions), typeof(AtlasApiOptions),
                [$"AtlasApiOptions:ApiKeySha256 holds '{Shorten(text)}', which is not a SHA-256 digest (64 hex digits). Configure digests, never keys: printf %s \"$KEY\" | sha256sum"]);
        return Convert.FromHexString(text);
    }

    private static string Shorten(string s) => s.Length <= 8 ? s : s[..8] + "...";
}
