using Microsoft.Net.Http.Headers;

namespace Mosaic.Server.ClientFiles;

/// <summary>
/// Sends the viewer's page (<see cref="ClientPage"/>) for "/" and "/index.html": revalidated on every visit
/// (no-cache) against its strong ETag, so a returning browser gets a 304 and a new build is never missed.
/// </summary>
public sealed class ClientPageMiddleware(RequestDelegate next, ClientPage page)
{
    public Task InvokeAsync(HttpContext context)
    {
        var request = context.Request;
        if (!(HttpMethods.IsGet(request.Method) || HttpMethods.IsHead(request.Method))
            || !(request.Path == "/" || request.Path.Equals("/" + ClientPage.PageFile, StringComparison.OrdinalIgnoreCase)))
            return next(context);
        var built = page.Current;
        if (built is null) return next(context);
        var response = context.Response;
        response.Headers.CacheControl = ClientFileServing.Revalidate;
        response.Headers.ETag = built.ETag;
        if (request.Headers.IfNoneMatch.Any(v => v is not null && Matches(v, built.ETag)))
        {
            response.StatusCode = StatusCodes.Status304NotModified;
            return Task.CompletedTask;
        }
        response.ContentType = "text/html; charset=utf-8";
        response.ContentLength = built.Bytes.Length;
        return HttpMethods.IsHead(request.Method) ? Task.CompletedTask : response.Body.WriteAsync(built.Bytes).AsTask();
    }

    private static bool Matches(string header, string etag) =>
        EntityTagHeaderValue.TryParseList([header], out var tags)
        && tags.Any(t => t.Equals(EntityTagHeaderValue.Any) || t.Compare(new EntityTagHeaderValue(etag), useStrongComparison: true));
}
