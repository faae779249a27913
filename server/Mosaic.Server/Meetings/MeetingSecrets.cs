using System.Buffers.Text;
using System.Security.Cryptography;
using System.Text;

namespace Mosaic.Server.Meetings;

/// <summary>Meeting ids, presenter keys and hand-over codes: random, URL-safe, and only their hashes kept.</summary>
public static class MeetingSecrets
{
    // 72 bits: 12 characters of base64url, unguessable enough for an id that is shared anyway.
    private const int IdBytes = 9;
    // 128 bits for anything that grants the right to drive.
    private const int KeyBytes = 16;

    public static string NewId() => Random(IdBytes);

    public static string NewKey() => Random(KeyBytes);

    /// <summary>SHA-256 of the secret's UTF-8 bytes: what the store keeps instead of the secret.</summary>
    public static byte[] Hash(string secret) => SHA256.HashData(Encoding.UTF8.GetBytes(secret));

    /// <summary>Whether <paramref name="candidate"/> hashes to <paramref name="hash"/>, in time that does not depend on where they differ.</summary>
    public static bool Matches(string? candidate, byte[]? hash) =>
        candidate is not null && hash is not null && CryptographicOperations.FixedTimeEquals(Hash(candidate), hash);

    /// <summary>Whether <paramref name="id"/> could be a meeting id (URL-safe characters, sensible length).</summary>
    public static bool IsWellFormedId(string? id) =>
        id is { Length: >= 8 and <= 64 } && id.All(c => char.IsAsciiLetterOrDigit(c) || c is '-' or '_');

    private static string Random(int bytes) => Base64Url.EncodeToString(RandomNumberGenerator.GetBytes(bytes));
}
