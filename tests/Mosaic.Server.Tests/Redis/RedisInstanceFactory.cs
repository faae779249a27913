using Microsoft.AspNetCore.Hosting;
using Microsoft.AspNetCore.Mvc.Testing;
using Microsoft.AspNetCore.SignalR.Client;
using Microsoft.AspNetCore.TestHost;
using Microsoft.Extensions.DependencyInjection;
using Mosaic.Server.Meetings;
using Mosaic.Server.Redis;
using Mosaic.Server.Tests.Meetings;

namespace Mosaic.Server.Tests.Redis;

/// <summary>One real server instance in memory, with its own cache folder, sharing the given Redis with the others.</summary>
public sealed class RedisInstanceFactory(string dataDirectory, string cacheDirectory, string redis, MeetingLimits? limits = null)
    : WebApplicationFactory<Program>
{
    protected override void ConfigureWebHost(IWebHostBuilder builder)
    {
        builder.UseSetting("data", dataDirectory);
        builder.UseSetting("cache", cacheDirectory);
        builder.UseSetting("redis", redis);
        builder.ConfigureTestServices(services =>
        {
            // Two servers and Redis on a busy test machine can miss the production half second; the timeout
            // itself is checked in RedisTileTierTests.
            services.AddSingleton(new RedisTileTierOptions { Timeout = TimeSpan.FromSeconds(5) });
            if (limits is not null) services.AddSingleton(limits);
        });
    }

    /// <summary>A started hub connection over WebSockets to this instance.</summary>
    public Task<HubConnection> ConnectAsync() => TestHubConnections.ConnectAsync(Server);
}
