using Microsoft.AspNetCore.Http.HttpResults;
using Mosaic.Server.Api;

namespace Mosaic.Server.Access;

/// <summary>Takes out of the field listing what the caller may not see, so a private field is not even named.</summary>
public sealed class VisibleFieldsFilter(FieldVisibility visibility) : IEndpointFilter
{
    public async ValueTask<object?> InvokeAsync(EndpointFilterInvocationContext context, EndpointFilterDelegate next)
    {
        var result = await next(context);
        if (result is not Ok<List<FieldDto>> { Value: { } fields }) return result;
        var caller = Caller.Of(context.HttpContext.User);
        if (caller?.Kind == CallerKind.Full) return result;
        return TypedResults.Ok(caller is null ? [] : fields.Where(f => visibility.CanSee(caller, f.Id)).ToList());
    }
}
