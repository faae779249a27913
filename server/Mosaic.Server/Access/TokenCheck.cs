using System.Security.Claims;

namespace Mosaic.Server.Access;

/// <summary>Turns a presented token (access or share) into a principal, or a reason it is refused.</summary>
public sealed class TokenCheck(AccessOptions options, ShareTokens shares)
{
    public (ClaimsPrincipal? Principal, string? Failure) Check(string token)
    {
        if (string.IsNullOrWhiteSpace(token)) return (null, "the token is empty");
        token = token.Trim();
        if (options.Tokens.Match(token) is { } fingerprint) return (Caller.FullPrincipal(fingerprint), null);
        if (ShareTokens.LooksLikeShareToken(token))
        {
            var share = shares.Check(token);
            return share.IsValid ? (Caller.SharePrincipal(share.Field!, share.Expires), null) : (null, share.Failure);
        }
        return (null, options.Tokens.IsConfigured ? "the token is not an access token of this server" : "this server has no access token, and the token is not a share token");
    }
}
