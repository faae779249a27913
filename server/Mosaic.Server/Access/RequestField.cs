using Microsoft.AspNetCore.Http.Metadata;
using Mosaic.Server.Views;

namespace Mosaic.Server.Access;

/// <summary>The field a request touches, found from the route (every per-field endpoint has {field}) or, for saved views, from the view.</summary>
public sealed record RequestField(string Field, FieldSource Source, string? ViewId)
{
    /// <summary>The tag every saved-view endpoint carries (see Endpoints/ViewEndpoints).</summary>
    private const string ViewsTag = "Views";

    public static RequestField? Find(HttpContext context, ViewStore views)
    {
        if (context.Request.RouteValues.TryGetValue("field", out var routeField) && routeField is string field)
            return new RequestField(field, FieldSource.Route, null);
        var endpoint = context.GetEndpoint();
        if (endpoint?.Metadata.GetMetadata<ITagsMetadata>()?.Tags.Contains(ViewsTag) != true) return null;
        if (context.Request.RouteValues.TryGetValue("id", out var routeId) && routeId is string id)
            return views.Find(id) is { } view ? new RequestField(view.Field, FieldSource.SavedView, id) : null;
        if (HttpMethods.IsGet(context.Request.Method) && context.Request.Query["field"].ToString() is { Length: > 0 } listed)
            return new RequestField(listed.Trim(), FieldSource.ViewListing, null);
        return null;
    }
}
