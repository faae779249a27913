using Microsoft.AspNetCore.Authentication.Cookies;

namespace Mosaic.Server.Access;

/// <summary>A sign-in cookie stops working once its access token is taken out of the configuration, or its share token expires.</summary>
public sealed class AccessCookieEvents(AccessOptions options, TimeProvider clock) : CookieAuthenticationEvents
{
    public override Task ValidatePrincipal(CookieValidatePrincipalContext context)
    {
        var caller = Caller.Of(context.Principal!);
        var valid = caller?.Kind switch
        {
            CallerKind.Full => context.Principal!.FindFirst(Caller.TokenClaim)?.Value is { } fingerprint && options.Tokens.Holds(fingerprint),
            CallerKind.Share => caller.Field is not null && caller.Expires is { } expires && clock.GetUtcNow() < expires,
            _ => false,
        };
        if (!valid) context.RejectPrincipal();
        return Task.CompletedTask;
    }
}
