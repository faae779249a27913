using System.Globalization;
using System.Security.Claims;

namespace Mosaic.Server.Access;

/// <summary>Who is asking, as the authentication handler established it.</summary>
public sealed record Caller(CallerKind Kind, string? Field, DateTimeOffset? Expires)
{
    public const string AuthenticationType = "mosaic";

    public const string KindClaim = "mosaic:caller";

    public const string FieldClaim = "mosaic:field";

    public const string ExpiresClaim = "mosaic:expires";

    /// <summary>Which configured access token signed the caller in (a digest prefix, never the token).</summary>
    public const string TokenClaim = "mosaic:token";

    public bool CanSee(string field, bool isPrivate) => Kind switch
    {
        CallerKind.Full => true,
        CallerKind.Share => string.Equals(field, Field, StringComparison.Ordinal),
        _ => !isPrivate,
    };

    public static Caller? Of(ClaimsPrincipal user)
    {
        ArgumentNullException.ThrowIfNull(user);
        var kind = user.FindFirst(KindClaim)?.Value;
        if (!Enum.TryParse<CallerKind>(kind, out var parsed)) return null;
        DateTimeOffset? expires = long.TryParse(user.FindFirst(ExpiresClaim)?.Value, NumberStyles.None, CultureInfo.InvariantCulture, out var s)
            ? DateTimeOffset.FromUnixTimeSeconds(s) : null;
        return new Caller(parsed, user.FindFirst(FieldClaim)?.Value, expires);
    }

    public static ClaimsPrincipal FullPrincipal(string tokenFingerprint) =>
        Principal([new(KindClaim, nameof(CallerKind.Full)), new(TokenClaim, tokenFingerprint)]);

    public static ClaimsPrincipal PublicPrincipal() => Principal([new(KindClaim, nameof(CallerKind.Public))]);

    public static ClaimsPrincipal SharePrincipal(string field, DateTimeOffset expires) => Principal([
        new(KindClaim, nameof(CallerKind.Share)),
        new(FieldClaim, field),
        new(ExpiresClaim, expires.ToUnixTimeSeconds().ToString(CultureInfo.InvariantCulture)),
    ]);

    private static ClaimsPrincipal Principal(Claim[] claims) => new(new ClaimsIdentity(claims, AuthenticationType));
}
