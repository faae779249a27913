using Microsoft.AspNetCore.Http;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Logging.Abstractions;
using Mosaic.Server.Errors;
using Mosaic.TileCache.Throttling;

namespace Mosaic.Server.Tests.TileServing;

/// <summary>The one exception-to-status mapping, for the errors a test cannot bring about on cue through a real request.</summary>
public sealed class ProblemHeaderTests
{
    private static async Task<HttpContext> HandleAsync(Exception exception)
    {
        var services = new ServiceCollection().AddLogging().AddProblemDetails().BuildServiceProvider();
        var context = new DefaultHttpContext { RequestServices = services };
        context.Response.Body = new MemoryStream();
        var handler = new ProblemExceptionHandler(services.GetRequiredService<IProblemDetailsService>(), NullLogger<ProblemExceptionHandler>.Instance);
        Assert.True(await handler.TryHandleAsync(context, exception, CancellationToken.None));
        return context;
    }

    [Fact]
    public async Task A_pyramid_still_building_is_503_with_Retry_After_and_never_stored()
    {
        var context = await HandleAsync(new PyramidNotReadyException("still building", 0.4));
        Assert.Equal(StatusCodes.Status503ServiceUnavailable, context.Response.StatusCode);
        Assert.Equal("1", context.Response.Headers.RetryAfter.ToString()); // RFC 9110 10.2.3 delay-seconds
        Assert.Equal("no-store", context.Response.Headers.CacheControl.ToString()); // RFC 9111 5.2.2.5
        Assert.StartsWith("application/problem+json", context.Response.ContentType); // RFC 9457 section 3
    }

    [Fact]
    public async Task A_full_render_queue_is_429_with_its_Retry_After_and_never_stored()
    {
        var context = await HandleAsync(new RenderQueueFullException(2, 8, 4));
        Assert.Equal(StatusCodes.Status429TooManyRequests, context.Response.StatusCode); // RFC 6585 section 4
        Assert.Equal("4", context.Response.Headers.RetryAfter.ToString());
        Assert.Equal("no-store", context.Response.Headers.CacheControl.ToString());
        context.Response.Body.Position = 0;
        using var problem = await System.Text.Json.JsonDocument.ParseAsync(context.Response.Body);
        Assert.Equal(429, problem.RootElement.GetProperty("status").GetInt32());
        Assert.Equal(4, problem.RootElement.GetProperty("retryAfterSeconds").GetInt32());
        Assert.Contains("ask again in 4 s", problem.RootElement.GetProperty("detail").GetString());
    }
}
