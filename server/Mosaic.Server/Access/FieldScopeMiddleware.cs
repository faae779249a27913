namespace Mosaic.Server.Access;

/// <summary>Sets <see cref="FieldScope"/> for the rest of the request, after authorization has established the caller.</summary>
public sealed class FieldScopeMiddleware(RequestDelegate next, FieldVisibility visibility)
{
    public Task InvokeAsync(HttpContext context)
    {
        var caller = Caller.Of(context.User);
        return caller is null || caller.Kind == CallerKind.Full ? next(context) : Scoped(context, caller);
    }

    private async Task Scoped(HttpContext context, Caller caller)
    {
        FieldScope.Set(id => !visibility.CanSee(caller, id));
        try
        {
            await next(context);
        }
        finally
        {
            FieldScope.Set(null);
        }
    }
}
