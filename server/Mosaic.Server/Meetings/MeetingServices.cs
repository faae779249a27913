using Microsoft.AspNetCore.SignalR;
using Microsoft.Extensions.DependencyInjection.Extensions;

namespace Mosaic.Server.Meetings;

public static class MeetingServices
{
    /// <summary>SignalR, the meeting store (in memory) and its limits; a limits or store registered earlier wins.</summary>
    public static IServiceCollection AddMeetings(this IServiceCollection services)
    {
        services.TryAddSingleton(new MeetingLimits());
        services.TryAddSingleton(TimeProvider.System);
        services.TryAddSingleton<IMeetingStore, InMemoryMeetingStore>();
        services.TryAddSingleton<MeetingStateReader>();
        services.AddSingleton<MeetingHubFilter>();
        services.AddSignalR().AddHubOptions<MeetingHub>(hub => hub.AddFilter<MeetingHubFilter>());
        // After SignalR's own setup of the hub's options, so the limit is not overwritten by the global default.
        services.AddOptions<HubOptions<MeetingHub>>()
            .Configure<MeetingLimits>((hub, limits) => hub.MaximumReceiveMessageSize = limits.MaxMessageBytes);
        return services;
    }

    public static IEndpointRouteBuilder MapMeetingHub(this IEndpointRouteBuilder routes)
    {
        routes.MapHub<MeetingHub>(MeetingHub.Path);
        return routes;
    }
}
