using Microsoft.AspNetCore.SignalR;

namespace Mosaic.Server.Meetings;

/// <summary>Turns a refused meeting request (or one the server cannot serve now) into a HubException, whose message SignalR passes on to the caller.</summary>
public sealed class MeetingHubFilter : IHubFilter
{
    public async ValueTask<object?> InvokeMethodAsync(HubInvocationContext invocationContext, Func<HubInvocationContext, ValueTask<object?>> next)
    {
        try
        {
            return await next(invocationContext);
        }
        catch (MeetingException e)
        {
            throw new HubException(e.Message);
        }
        catch (Errors.MosaicRequestException e)
        {
            // A shared store that cannot be reached (503) or a missing field says so to the caller, not "an unexpected error".
            throw new HubException(e.Message);
        }
    }
}
