using Microsoft.AspNetCore.Authentication;

namespace Mosaic.Server.Access;

/// <summary>/signin (the form and its post) and /signout, open to anyone.</summary>
public static class SignInEndpoints
{
    public static IEndpointRouteBuilder MapSignInEndpoints(this IEndpointRouteBuilder routes)
    {
        routes.MapGet(SignInPage.Path, Form).AllowAnonymous().ExcludeFromDescription();
        routes.MapPost(SignInPage.Path, SignIn).AllowAnonymous().ExcludeFromDescription();
        routes.MapPost("/signout", (Func<HttpContext, Task<IResult>>)SignOut).AllowAnonymous().WithTags("Access")
            .WithSummary("Forgets the sign-in cookie of this browser.");
        return routes;
    }

    private static IResult Form(string? @return) =>
        Page(SignInPage.Form(SignInPage.SafeReturn(@return), null), StatusCodes.Status200OK);

    private static async Task<IResult> SignIn(HttpContext context, TokenCheck tokens, TimeProvider clock)
    {
        if (!context.Request.HasFormContentType)
            return Page(SignInPage.Form("/", "the sign-in form was not sent as a form"), StatusCodes.Status400BadRequest);
        var form = await context.Request.ReadFormAsync(context.RequestAborted);
        var returnTo = SignInPage.SafeReturn(form["return"]);
        var (principal, failure) = tokens.Check(form[SignInPage.TokenParameter].ToString());
        if (principal is null) return Page(SignInPage.Form(returnTo, failure), StatusCodes.Status401Unauthorized);
        await AccessSignIn.SignInAsync(context, principal, clock);
        // The form was posted by this server's own page, so a redirect keeps the SameSite=Strict cookie.
        context.Response.Headers.CacheControl = "no-store";
        return Results.Redirect(returnTo, permanent: false, preserveMethod: false);
    }

    private static async Task<IResult> SignOut(HttpContext context)
    {
        await context.SignOutAsync(AccessSchemes.Cookie);
        return Results.Redirect(SignInPage.Path);
    }

    private static IResult Page(string html, int status) =>
        Results.Content(html, "text/html; charset=utf-8", statusCode: status);
}
