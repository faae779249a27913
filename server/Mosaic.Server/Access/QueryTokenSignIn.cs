namespace Mosaic.Server.Access;

/// <summary>
/// "?token=..." on any GET signs the browser in (an HttpOnly cookie) and sends it on to the same address without the
/// token, so the token does not stay in the address bar, the history or a copied link.
/// </summary>
public sealed class QueryTokenSignIn(RequestDelegate next, TokenCheck tokens, TimeProvider clock, IProblemDetailsService problems)
{
    public async Task InvokeAsync(HttpContext context)
    {
        var request = context.Request;
        if (!(HttpMethods.IsGet(request.Method) || HttpMethods.IsHead(request.Method)) || !request.Query.TryGetValue(SignInPage.TokenParameter, out var given))
        {
            await next(context);
            return;
        }
        var onward = SignInPage.WithoutToken(request);
        context.Response.Headers.CacheControl = "no-store";
        context.Response.Headers["Referrer-Policy"] = "no-referrer";
        var (principal, failure) = tokens.Check(given.ToString());
        if (principal is null)
        {
            context.Response.StatusCode = StatusCodes.Status401Unauthorized;
            if (SignInPage.WantsPage(request))
            {
                context.Response.ContentType = "text/html; charset=utf-8";
                await context.Response.WriteAsync(SignInPage.Form(onward, failure));
            }
            else
            {
                await problems.WriteAsync(new ProblemDetailsContext
                {
                    HttpContext = context,
                    ProblemDetails = new Microsoft.AspNetCore.Mvc.ProblemDetails
                    {
                        Status = StatusCodes.Status401Unauthorized, Title = "Token refused", Detail = $"The token was refused: {failure}.",
                    },
                });
            }
            return;
        }
        await AccessSignIn.SignInAsync(context, principal, clock);
        if (SignInPage.WantsPage(request))
        {
            context.Response.ContentType = "text/html; charset=utf-8";
            await context.Response.WriteAsync(SignInPage.Onward(onward));
        }
        else
        {
            context.Response.StatusCode = StatusCodes.Status303SeeOther;
            context.Response.Headers.Location = onward;
        }
    }
}
