using System.Security.Claims;
using Microsoft.AspNetCore.Authentication;

namespace Mosaic.Server.Access;

/// <summary>Puts a checked principal into the sign-in cookie: until its share token expires, or for 30 days with an access token.</summary>
public static class AccessSignIn
{
    public static readonly TimeSpan FullAccessCookieLifetime = TimeSpan.FromDays(30);

    public static Task SignInAsync(HttpContext context, ClaimsPrincipal principal, TimeProvider clock)
    {
        ArgumentNullException.ThrowIfNull(context);
        var caller = Caller.Of(principal) ?? throw new ArgumentException("not a Mosaic caller", nameof(principal));
        var expires = caller.Expires ?? clock.GetUtcNow() + FullAccessCookieLifetime;
        return context.SignInAsync(AccessSchemes.Cookie, principal, new AuthenticationProperties
        {
            IsPersistent = true,
            ExpiresUtc = expires,
            AllowRefresh = false,
        });
    }
}
