using Microsoft.AspNetCore.Http.HttpResults;

namespace Mosaic.Server.Endpoints;

public static class HealthEndpoints
{
    public static void MapHealthEndpoints(this IEndpointRouteBuilder routes) =>
        routes.MapGet("/healthz", Health).WithTags("Health").WithSummary("200 while the server is up.");

    private static Ok<HealthDto> Health() => TypedResults.Ok(new HealthDto("ok"));

    public sealed record HealthDto(string Status);
}
