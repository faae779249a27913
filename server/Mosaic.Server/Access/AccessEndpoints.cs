using System.Text.Json;
using Microsoft.AspNetCore.Http.HttpResults;
using Mosaic.Server.Errors;
using Mosaic.Server.Fields;

namespace Mosaic.Server.Access;

/// <summary>Who the caller is (GET /api/access), and making share tokens (POST /api/fields/{field}/share-tokens).</summary>
public static class AccessEndpoints
{
    private const int MaxBodyBytes = 1024;

    public static IEndpointRouteBuilder MapAccessEndpoints(this IEndpointRouteBuilder routes)
    {
        routes.MapGet("/api/access", Describe).WithTags("Access")
            .WithSummary("Who the caller is: 'full' (an access token), 'public' (no token) or 'share' (a share token, with its field and expiry); canShare says whether share links may be made.");
        routes.MapPost("/api/fields/{field}/share-tokens", Create).WithTags("Access").WithMetadata(FullAccessOnly.Instance)
            .WithSummary("Makes a signed, read-only token for this field: body {lifetimeSeconds} (60 to 7776000). Needs an access token.");
        return routes;
    }

    private static Ok<CallerDto> Describe(HttpContext context, AccessOptions options)
    {
        var caller = Caller.Of(context.User)!;
        return TypedResults.Ok(new CallerDto(caller.Kind.ToString().ToLowerInvariant(), caller.Field, caller.Expires?.UtcDateTime,
            caller.Kind == CallerKind.Full, options.Anonymous == AnonymousAccess.None));
    }

    private static async Task<Created<ShareTokenDto>> Create(string field, HttpRequest request, FieldCatalog catalog, ShareTokens shares, CancellationToken cancellationToken)
    {
        var known = catalog.Get(field);
        var lifetime = await Lifetime(request, cancellationToken);
        var (token, expires) = shares.Create(known.Id, lifetime);
        request.HttpContext.Response.Headers.CacheControl = "no-store";
        return TypedResults.Created((string?)null, new ShareTokenDto(token, known.Id, expires.UtcDateTime, ShareTokens.Scope));
    }

    private static async Task<TimeSpan> Lifetime(HttpRequest request, CancellationToken cancellationToken)
    {
        if (request.ContentLength > MaxBodyBytes) throw Bad("body", $"The body is at most {MaxBodyBytes} bytes: {{\"lifetimeSeconds\": n}}.");
        JsonDocument body;
        try
        {
            using var buffer = new MemoryStream();
            await request.Body.CopyToAsync(buffer, cancellationToken);
            if (buffer.Length > MaxBodyBytes) throw Bad("body", $"The body is at most {MaxBodyBytes} bytes: {{\"lifetimeSeconds\": n}}.");
            body = JsonDocument.Parse(buffer.ToArray());
        }
        catch (JsonException e)
        {
            throw Bad("body", $"The body is not valid JSON: {e.Message}");
        }
        using (body)
        {
            if (body.RootElement.ValueKind != JsonValueKind.Object || !body.RootElement.TryGetProperty("lifetimeSeconds", out var value))
                throw Bad("lifetimeSeconds", "'lifetimeSeconds' is required: how long the link works, in seconds.");
            var min = (long)AccessOptions.MinimumShareLifetime.TotalSeconds;
            var max = (long)AccessOptions.MaximumShareLifetime.TotalSeconds;
            if (value.ValueKind != JsonValueKind.Number || !value.TryGetInt64(out var seconds) || seconds < min || seconds > max)
                throw Bad("lifetimeSeconds", $"'lifetimeSeconds' must be a whole number from {min} (a minute) to {max} (90 days); got {value.GetRawText()}.");
            return TimeSpan.FromSeconds(seconds);
        }
    }

    private static MosaicRequestException Bad(string parameter, string detail) => MosaicRequestException.BadParameter(parameter, detail);
}
