using System.Security.Cryptography;
using System.Text;

namespace Mosaic.Server.Access;

/// <summary>The configured access tokens, kept only as SHA-256 digests and compared in constant time.</summary>
public sealed class AccessTokens
{
    public static readonly AccessTokens None = new([]);

    private readonly byte[][] _digests;

    public AccessTokens(IEnumerable<string> tokens) =>
        _digests = tokens.Select(Digest).DistinctBy(Convert.ToHexString).ToArray();

    public bool IsConfigured => _digests.Length > 0;

    /// <summary>A short, non-reversible name of the token that matched, so a signed-in cookie stops working once its token is removed.</summary>
    public string? Match(string presented)
    {
        var digest = Digest(presented);
        string? matched = null;
        // Every digest is compared, so the time taken says nothing about which one matched.
        foreach (var known in _digests)
            if (CryptographicOperations.FixedTimeEquals(known, digest)) matched = Convert.ToHexString(known, 0, 8);
        return matched;
    }

    public bool Holds(string fingerprint) =>
        _digests.Any(d => string.Equals(Convert.ToHexString(d, 0, 8), fingerprint, StringComparison.Ordinal));

    private static byte[] Digest(string token) => SHA256.HashData(Encoding.UTF8.GetBytes(token));
}
