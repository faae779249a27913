namespace Mosaic.Server.Security;

/// <summary>
/// Adds the security headers to every response, API and client alike. Set when the response starts, so the
/// exception handler and the status-code pages, which clear headers, cannot drop them.
/// </summary>
public sealed class SecurityHeaders(RequestDelegate next, IWebHostEnvironment environment)
{
    private readonly string _policy = ContentSecurityPolicy.For(environment.WebRootFileProvider);

    private static readonly Func<object, Task> AddHeaders = state =>
    {
        var (context, policy) = ((HttpContext, string))state;
        var headers = context.Response.Headers;
        headers.ContentSecurityPolicy = policy;
        headers.XContentTypeOptions = "nosniff";
        headers.XFrameOptions = "DENY"; // for browsers that predate frame-ancestors
        headers["Referrer-Policy"] = "no-referrer";
        headers["Cross-Origin-Opener-Policy"] = "same-origin";
        return Task.CompletedTask;
    };

    public Task InvokeAsync(HttpContext context)
    {
        context.Response.OnStarting(AddHeaders, (context, _policy));
        return next(context);
    }
}
