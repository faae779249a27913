using System.Security.Cryptography;

namespace Mosaic.Server.Views;

/// <summary>The random parts of a saved view: its id (in links) and its delete key (told once, stored only as SHA-256).</summary>
public static class ViewTokens
{
    /// <summary>12 characters of base64url: 72 random bits, so ids cannot be guessed or enumerated.</summary>
    public const int IdLength = 12;

    private const string UrlSafe = "ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789-_";

    public static string NewId() => RandomNumberGenerator.GetString(UrlSafe, IdLength);

    /// <summary>128 random bits, base64url without padding (RFC 4648 section 5).</summary>
    public static string NewDeleteKey() => Base64Url(RandomNumberGenerator.GetBytes(16));

    public static byte[] Hash(string deleteKey) => SHA256.HashData(System.Text.Encoding.UTF8.GetBytes(deleteKey));

    /// <summary>True where the text could be an id this server made: the only ones worth a database look-up.</summary>
    public static bool IsWellFormedId(string? id) =>
        id is { Length: IdLength } && id.All(c => UrlSafe.Contains(c, StringComparison.Ordinal));

    private static string Base64Url(byte[] bytes) =>
        Convert.ToBase64String(bytes).TrimEnd('=').Replace('+', '-').Replace('/', '_');
}
