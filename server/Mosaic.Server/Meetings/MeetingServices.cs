using Microsoft.AspNetCore.SignalR;
using Microsoft.AspNetCore.SignalR.StackExchangeRedis;
using Microsoft.Extensions.DependencyInjection.Extensions;
using Mosaic.Server.Redis;
using StackExchange.Redis;

namespace Mosaic.Server.Meetings;

public static class MeetingServices
{
    /// <summary>Prefix of the SignalR backplane's channels, so other users of the same Redis are not disturbed.</summary>
    public const string ChannelPrefix = "mosaic:hub";

    /// <summary>
    /// SignalR, the meeting store and its limits; a limits or store registered earlier wins. With
    /// <paramref name="sharedOverRedis"/> (needs <c>AddMosaicRedis</c>) meetings live in Redis and hub messages cross
    /// instances over its backplane, so several instances behind one load balancer hold the same meetings.
    /// </summary>
    public static IServiceCollection AddMeetings(this IServiceCollection services, bool sharedOverRedis = false)
    {
        services.TryAddSingleton(new MeetingLimits());
        services.TryAddSingleton(TimeProvider.System);
        if (sharedOverRedis) services.TryAddSingleton<IMeetingStore, RedisMeetingStore>();
        services.TryAddSingleton<IMeetingStore, InMemoryMeetingStore>();
        services.TryAddSingleton<MeetingStateReader>();
        services.AddSingleton<MeetingHubFilter>();
        var signalR = services.AddSignalR().AddHubOptions<MeetingHub>(hub => hub.AddFilter<MeetingHubFilter>());
        if (sharedOverRedis)
        {
            signalR.AddStackExchangeRedis(backplane => backplane.Configuration.ChannelPrefix = RedisChannel.Literal(ChannelPrefix));
            // The backplane uses the instance's one multiplexer instead of opening its own.
            services.AddOptions<RedisOptions>().Configure<RedisConnection>((backplane, connection) =>
                backplane.ConnectionFactory = _ => Task.FromResult(connection.Borrowed));
        }
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
