using Microsoft.AspNetCore.Authorization;
using Microsoft.AspNetCore.Http.Metadata;
using Microsoft.AspNetCore.SignalR;
using Mosaic.Server.Views;

namespace Mosaic.Server.Access;

/// <summary>
/// Decides every request in one place: public callers see fields that are not private; a share caller reads its one
/// field (and what belongs to no field: the page, palettes); meeting connections must come from an allowed Origin.
/// </summary>
public sealed class AccessAuthorizationHandler(AccessOptions options, FieldVisibility visibility, ViewStore views)
    : AuthorizationHandler<AccessRequirement, HttpContext>
{
    /// <summary>The tag of /healthz, which answers anyone (it says nothing but "ok").</summary>
    private const string HealthTag = "Health";

    protected override Task HandleRequirementAsync(AuthorizationHandlerContext context, AccessRequirement requirement, HttpContext http)
    {
        var endpoint = http.GetEndpoint();
        if (endpoint?.Metadata.GetMetadata<ITagsMetadata>()?.Tags.Contains(HealthTag) == true)
        {
            context.Succeed(requirement);
            return Task.CompletedTask;
        }
        if (Caller.Of(context.User) is not { } caller) return Task.CompletedTask; // not signed in: a challenge

        var failure = Refusal(caller, http, endpoint);
        if (failure is null) context.Succeed(requirement);
        else context.Fail(failure);
        return Task.CompletedTask;
    }

    private AccessFailure? Refusal(Caller caller, HttpContext http, Endpoint? endpoint)
    {
        var isHub = endpoint?.Metadata.GetMetadata<HubMetadata>() is not null;
        if (isHub && !OriginCheck.IsAllowed(http.Request, options))
            return new AccessFailure(this, AccessRefusal.ForeignOrigin,
                $"Meeting connections are accepted from this server's own pages; origin '{http.Request.Headers.Origin}' is not among them (see --allowed-origins).");
        if (caller.Kind == CallerKind.Full) return null;

        var readOnly = HttpMethods.IsGet(http.Request.Method) || HttpMethods.IsHead(http.Request.Method);
        if (caller.Kind == CallerKind.Share && (isHub || !readOnly))
            return new AccessFailure(this, AccessRefusal.ReadOnly, isHub
                ? "A share link opens one field to look at; it does not join meetings."
                : "A share link is read-only: it cannot save views, start meetings or change anything.");
        if (endpoint?.Metadata.GetMetadata<FullAccessOnly>() is not null)
            return new AccessFailure(this, AccessRefusal.NeedsAccessToken, "Only a caller with an access token may do this.");

        var field = RequestField.Find(http, views);
        if (field is not null && !visibility.CanSee(caller, field.Field))
            return new AccessFailure(this, AccessRefusal.Hidden, $"There is no field '{field.Field}'.", field);
        return null;
    }
}
