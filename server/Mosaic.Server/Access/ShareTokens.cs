using System.Globalization;
using System.Security.Cryptography;
using System.Text;
using Microsoft.AspNetCore.WebUtilities;

namespace Mosaic.Server.Access;

/// <summary>
/// Signed, expiring, read-only tokens for one field: "ms1.{field, base64url}.{expiry, Unix seconds}.{HMAC-SHA256,
/// base64url}", the MAC taken over the UTF-8 bytes of "{field}\n{expiry}\nread" with the <see cref="ShareKey"/>.
/// Nothing is stored: the signature is the proof, so a token cannot be revoked alone (only all, with the key).
/// </summary>
public sealed class ShareTokens(ShareKey key, TimeProvider clock)
{
    public const string Prefix = "ms1.";

    public const string Scope = "read";

    public static bool LooksLikeShareToken(string token) => token.StartsWith(Prefix, StringComparison.Ordinal);

    public (string Token, DateTimeOffset Expires) Create(string field, TimeSpan lifetime)
    {
        ArgumentException.ThrowIfNullOrEmpty(field);
        if (lifetime < AccessOptions.MinimumShareLifetime || lifetime > AccessOptions.MaximumShareLifetime)
            throw new ArgumentOutOfRangeException(nameof(lifetime), lifetime, "outside the share-link lifetime bounds");
        var expires = DateTimeOffset.FromUnixTimeSeconds(clock.GetUtcNow().ToUnixTimeSeconds() + (long)Math.Ceiling(lifetime.TotalSeconds));
        var expiry = expires.ToUnixTimeSeconds().ToString(CultureInfo.InvariantCulture);
        var token = $"{Prefix}{WebEncoders.Base64UrlEncode(Encoding.UTF8.GetBytes(field))}.{expiry}.{WebEncoders.Base64UrlEncode(Sign(field, expiry))}";
        return (token, expires);
    }

    public ShareTokenCheck Check(string token)
    {
        ArgumentNullException.ThrowIfNull(token);
        var parts = token.Split('.');
        if (parts.Length != 4 || parts[0] + "." != Prefix)
            return ShareTokenCheck.Refused("the share token is malformed (it should be four dot-separated parts starting with 'ms1')");
        string field;
        byte[] mac;
        try
        {
            field = new UTF8Encoding(false, throwOnInvalidBytes: true).GetString(WebEncoders.Base64UrlDecode(parts[1]));
            mac = WebEncoders.Base64UrlDecode(parts[3]);
        }
        catch (Exception e) when (e is FormatException or DecoderFallbackException)
        {
            return ShareTokenCheck.Refused("the share token is malformed (a part is not base64url)");
        }
        if (field.Length == 0 || !long.TryParse(parts[2], NumberStyles.None, CultureInfo.InvariantCulture, out var seconds)
            || seconds > DateTimeOffset.MaxValue.ToUnixTimeSeconds())
            return ShareTokenCheck.Refused("the share token is malformed (no field or no expiry)");
        // The signature is checked before the expiry, so a tampered expiry is reported as tampering.
        if (!CryptographicOperations.FixedTimeEquals(mac, Sign(field, parts[2])))
            return ShareTokenCheck.Refused("the share token's signature does not match: it was altered, or signed by another server or an older key");
        var expires = DateTimeOffset.FromUnixTimeSeconds(seconds);
        if (clock.GetUtcNow() >= expires)
            return ShareTokenCheck.Refused(string.Create(CultureInfo.InvariantCulture, $"the share token expired at {expires:yyyy-MM-dd'T'HH:mm:ss'Z'}"));
        return new ShareTokenCheck(field, expires, null);
    }

    private byte[] Sign(string field, string expiry) =>
        HMACSHA256.HashData(key.Bytes, Encoding.UTF8.GetBytes($"{field}\n{expiry}\n{Scope}"));
}
