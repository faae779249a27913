using System.Text.Encodings.Web;
using Microsoft.AspNetCore.Authentication;
using Microsoft.Extensions.Options;

namespace Mosaic.Server.Access;

/// <summary>
/// Authenticates every request: "Authorization: Bearer {access or share token}", else the sign-in cookie, else (where
/// anonymous callers are let in) a public caller. The answer to a refusal is written by <see cref="AccessResultHandler"/>.
/// </summary>
public sealed class TokenAuthenticationHandler(
    IOptionsMonitor<AuthenticationSchemeOptions> schemeOptions, ILoggerFactory loggerFactory, UrlEncoder encoder,
    AccessOptions access, TokenCheck tokens)
    : AuthenticationHandler<AuthenticationSchemeOptions>(schemeOptions, loggerFactory, encoder)
{
    protected override async Task<AuthenticateResult> HandleAuthenticateAsync()
    {
        var header = Request.Headers.Authorization.ToString();
        if (header.Length > 0)
        {
            if (!header.StartsWith("Bearer ", StringComparison.OrdinalIgnoreCase))
                return Refuse("the Authorization header must be 'Bearer {token}'");
            var (principal, failure) = tokens.Check(header["Bearer ".Length..]);
            return principal is null ? Refuse(failure!) : AuthenticateResult.Success(new AuthenticationTicket(principal, Scheme.Name));
        }

        var cookie = await Context.AuthenticateAsync(AccessSchemes.Cookie);
        if (cookie.Succeeded) return AuthenticateResult.Success(new AuthenticationTicket(cookie.Principal, Scheme.Name));

        return access.Anonymous == AnonymousAccess.PublicFields
            ? AuthenticateResult.Success(new AuthenticationTicket(Caller.PublicPrincipal(), Scheme.Name))
            : AuthenticateResult.NoResult();
    }

    private AuthenticateResult Refuse(string failure)
    {
        Context.Items[AccessSchemes.FailureItem] = failure;
        return AuthenticateResult.Fail(failure);
    }
}
