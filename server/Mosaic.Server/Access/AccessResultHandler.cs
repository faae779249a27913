using Microsoft.AspNetCore.Authorization;
using Microsoft.AspNetCore.Authorization.Policy;
using Microsoft.AspNetCore.Mvc;
using Mosaic.Server.Errors;

namespace Mosaic.Server.Access;

/// <summary>
/// Writes the answer to a refused request: a page asks a person to sign in, a program gets 401 problem details naming
/// why; a hidden field is answered exactly as a missing one (its name is not confirmed); the rest is 403.
/// </summary>
public sealed class AccessResultHandler(IProblemDetailsService problems) : IAuthorizationMiddlewareResultHandler
{
    private readonly AuthorizationMiddlewareResultHandler _default = new();

    public async Task HandleAsync(RequestDelegate next, HttpContext context, AuthorizationPolicy policy, PolicyAuthorizationResult authorizeResult)
    {
        if (authorizeResult.Succeeded)
        {
            await _default.HandleAsync(next, context, policy, authorizeResult);
            return;
        }
        var failure = authorizeResult.AuthorizationFailure?.FailureReasons.OfType<AccessFailure>().FirstOrDefault();
        if (failure is null)
        {
            await Unauthenticated(context);
            return;
        }
        switch (failure.Refusal)
        {
            case AccessRefusal.Hidden when failure.Field!.Source == FieldSource.ViewListing:
                context.Response.StatusCode = StatusCodes.Status200OK;
                context.Response.ContentType = "application/json; charset=utf-8";
                await context.Response.WriteAsync("[]");
                return;
            case AccessRefusal.Hidden when failure.Field!.Source == FieldSource.SavedView:
                throw MosaicRequestException.NotFound("View", $"There is no saved view '{failure.Field.ViewId}'.", "id");
            case AccessRefusal.Hidden:
                // The same exception the field catalog throws for a field that is not there, so the answers match.
                throw MosaicRequestException.NotFound("Field", $"There is no field '{failure.Field!.Field}'.", "field");
            default:
                await Problem(context, StatusCodes.Status403Forbidden, "Not allowed", failure.Message);
                return;
        }
    }

    private Task Unauthenticated(HttpContext context)
    {
        var why = context.Items[AccessSchemes.FailureItem] as string;
        if (SignInPage.WantsPage(context.Request))
        {
            context.Response.Redirect(SignInPage.Address(context.Request));
            return Task.CompletedTask;
        }
        context.Response.Headers.WWWAuthenticate = why is null ? "Bearer" : "Bearer error=\"invalid_token\"";
        return Problem(context, StatusCodes.Status401Unauthorized, why is null ? "Access token required" : "Token refused",
            why is null
                ? "This server needs a token: send 'Authorization: Bearer {token}', or sign in at /signin."
                : $"The token was refused: {why}.");
    }

    private async Task Problem(HttpContext context, int status, string title, string detail)
    {
        context.Response.StatusCode = status;
        context.Response.Headers.CacheControl = "no-store";
        await problems.WriteAsync(new ProblemDetailsContext
        {
            HttpContext = context,
            ProblemDetails = new ProblemDetails { Status = status, Title = title, Detail = detail },
        });
    }
}
