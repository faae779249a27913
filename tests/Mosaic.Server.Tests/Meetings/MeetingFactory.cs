using Microsoft.AspNetCore.Hosting;
using Microsoft.AspNetCore.Mvc.Testing;
using Microsoft.AspNetCore.SignalR.Client;
using Microsoft.AspNetCore.TestHost;
using Microsoft.Extensions.DependencyInjection;
using Mosaic.Server.Meetings;

namespace Mosaic.Server.Tests.Meetings;

/// <summary>The real server in memory with the meeting limits and clock a test chooses, and hub connections to it.</summary>
public sealed class MeetingFactory(string dataDirectory, string cacheDirectory, MeetingLimits? limits = null, TimeProvider? clock = null)
    : WebApplicationFactory<Program>
{
    protected override void ConfigureWebHost(IWebHostBuilder builder)
    {
        builder.UseSetting("data", dataDirectory);
        builder.UseSetting("cache", cacheDirectory);
        builder.ConfigureTestServices(services =>
        {
            if (limits is not null) services.AddSingleton(limits);
            if (clock is not null) services.AddSingleton(clock);
        });
    }

    /// <summary>A started hub connection over WebSockets through the test server.</summary>
    public Task<HubConnection> ConnectAsync() => TestHubConnections.ConnectAsync(Server);
}
