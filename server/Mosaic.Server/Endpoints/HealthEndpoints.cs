using Microsoft.AspNetCore.Http.HttpResults;
using Mosaic.Server.Redis;

namespace Mosaic.Server.Endpoints;

public static class HealthEndpoints
{
    public static void MapHealthEndpoints(this IEndpointRouteBuilder routes) =>
        routes.MapGet("/healthz", Health).WithTags("Health")
            .WithSummary("200 while the server is up, whatever Redis does. 'redis' is off (none configured), up, or down (this instance serves from its own caches until it is back).");

    // Cheap enough to poll: the state comes from the connection's own bookkeeping, not a call to Redis.
    private static Ok<HealthDto> Health(HttpContext context) =>
        TypedResults.Ok(new HealthDto("ok", RedisHealth.Name(RedisHealth.StateOf(context.RequestServices))));

    public sealed record HealthDto(string Status, string Redis);
}
