using System.Net;
using Microsoft.AspNetCore.WebUtilities;

namespace Mosaic.Server.Access;

/// <summary>The pages a person sees: the sign-in form, and the hop that drops the token from the address after signing in.</summary>
public static class SignInPage
{
    public const string Path = "/signin";

    public const string TokenParameter = "token";

    /// <summary>A person's browser navigating (rather than a script or a program) gets pages, not problem details.</summary>
    public static bool WantsPage(HttpRequest request) =>
        (HttpMethods.IsGet(request.Method) || HttpMethods.IsHead(request.Method))
        && request.Headers.Accept.Any(a => a is not null && a.Contains("text/html", StringComparison.OrdinalIgnoreCase));

    /// <summary>The sign-in page, coming back to this request's address (without any token) afterwards.</summary>
    public static string Address(HttpRequest request) =>
        QueryHelpers.AddQueryString(Path, "return", WithoutToken(request));

    /// <summary>This request's path and query with the token parameter taken out.</summary>
    public static string WithoutToken(HttpRequest request)
    {
        var kept = request.Query.Where(p => !string.Equals(p.Key, TokenParameter, StringComparison.OrdinalIgnoreCase))
            .SelectMany(p => p.Value.Select(v => new KeyValuePair<string, string?>(p.Key, v)));
        return (request.PathBase + request.Path).Value + QueryString.Create(kept).Value;
    }

    /// <summary>Only a path on this server is a place to return to, never another site.</summary>
    public static string SafeReturn(string? address) =>
        address is { Length: > 0 } && address[0] == '/' && !address.StartsWith("//", StringComparison.Ordinal) && !address.StartsWith("/\\", StringComparison.Ordinal)
            ? address : "/";

    public static string Form(string returnTo, string? problem) => $"""
        <!DOCTYPE html>
        <html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width">
        <meta name="referrer" content="no-referrer"><title>Sign in to Mosaic</title></head>
        <body><main><h1>Sign in</h1>
        <p>This Mosaic server is open to token holders only. Paste the access token you were given.</p>
        {(problem is null ? "" : $"<p role=\"alert\" id=\"signin-problem\">The token was refused: {WebUtility.HtmlEncode(problem)}.</p>")}
        <form method="post" action="{Path}">
        <label for="signin-token">Access token</label>
        <input id="signin-token" name="{TokenParameter}" type="password" autocomplete="off" required>
        <input type="hidden" name="return" value="{WebUtility.HtmlEncode(returnTo)}">
        <button type="submit">Sign in</button>
        </form></main></body></html>
        """;

    /// <summary>
    /// A page that moves on by itself rather than a 302: a SameSite=Strict cookie set on a link followed from another
    /// site is not sent on a redirect of that same navigation, but is on one the page itself starts.
    /// </summary>
    public static string Onward(string address)
    {
        var encoded = WebUtility.HtmlEncode(address);
        return $"""
            <!DOCTYPE html>
            <html lang="en"><head><meta charset="utf-8"><meta name="referrer" content="no-referrer">
            <meta http-equiv="refresh" content="0; url={encoded}"><title>Signed in</title></head>
            <body><p>Signed in. <a href="{encoded}">Continue</a></p></body></html>
            """;
    }
}
