using System.Text.Json;
using Microsoft.AspNetCore.Http.HttpResults;
using Mosaic.Server.Errors;
using Mosaic.Server.Meetings;

namespace Mosaic.Server.Endpoints;

public static class MeetingEndpoints
{
    public static void MapMeetingEndpoints(this IEndpointRouteBuilder routes) =>
        routes.MapPost("/api/meetings", Start).WithTags("Meetings")
            .WithSummary("Starts a live meeting showing the view state in the body ({\"state\": {...}}); the presenter key drives it over /hubs/meeting.");

    private static Created<MeetingStartedDto> Start(JsonElement body, MeetingStateReader states, IMeetingStore store)
    {
        try
        {
            if (body.ValueKind != JsonValueKind.Object || !body.TryGetProperty("state", out var state))
                throw MosaicRequestException.BadParameter("state", "The body must be a JSON object with a 'state' member: the view's link parameters.");
            var started = store.Start(states.Read(state));
            var joinUrl = $"/?meeting={started.Id}";
            return TypedResults.Created(joinUrl, new MeetingStartedDto(started.Id, joinUrl, started.PresenterKey));
        }
        catch (MeetingException e)
        {
            throw ToProblem(e);
        }
    }

    private static MosaicRequestException ToProblem(MeetingException e) => e.Error switch
    {
        MeetingError.UnknownField => new MosaicRequestException(StatusCodes.Status422UnprocessableEntity, "Unknown field", e.Message, e.Parameter),
        MeetingError.Full => new MosaicRequestException(StatusCodes.Status503ServiceUnavailable, "Too many meetings", e.Message, e.Parameter),
        MeetingError.NotFound => MosaicRequestException.NotFound("Meeting", e.Message, e.Parameter),
        MeetingError.WrongKey => new MosaicRequestException(StatusCodes.Status403Forbidden, "Wrong key", e.Message, e.Parameter),
        _ => MosaicRequestException.BadParameter(e.Parameter ?? "state", e.Message),
    };
}
