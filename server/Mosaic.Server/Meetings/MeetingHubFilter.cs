using Microsoft.AspNetCore.SignalR;

namespace Mosaic.Server.Meetings;

/// <summary>Turns a refused meeting request into a HubException, whose message SignalR passes on to the caller.</summary>
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
    }
}
