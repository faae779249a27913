using Microsoft.AspNetCore.Hosting;
using Microsoft.AspNetCore.Mvc.Testing;
using Microsoft.AspNetCore.SignalR.Client;
using Microsoft.AspNetCore.TestHost;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Logging;
using Mosaic.Server.Tests.Meetings;

namespace Mosaic.Server.Tests.Access;

/// <summary>The real server in memory with the access settings a test chooses (as the command line gives them), a clock, and its log captured.</summary>
public sealed class AccessFactory(AccessFixture fixture, IReadOnlyDictionary<string, string> settings, TimeProvider? clock = null)
    : WebApplicationFactory<Program>
{
    public CapturedLog Log { get; } = new();

    protected override void ConfigureWebHost(IWebHostBuilder builder)
    {
        builder.UseSetting("data", fixture.DataDirectory);
        builder.UseSetting("cache", fixture.CacheDirectory);
        builder.UseSetting("state", fixture.StateDirectory);
        foreach (var (key, value) in settings) builder.UseSetting(key, value);
        builder.ConfigureLogging(logging =>
        {
            logging.SetMinimumLevel(LogLevel.Trace);
            logging.AddProvider(Log);
        });
        if (clock is not null) builder.ConfigureTestServices(services => services.AddSingleton(clock));
    }

    /// <summary>A client that keeps cookies and shows redirects rather than following them; https when asked.</summary>
    public HttpClient Browser(bool https = false) => CreateClient(new WebApplicationFactoryClientOptions
    {
        AllowAutoRedirect = false,
        HandleCookies = true,
        BaseAddress = new Uri(https ? "https://localhost/" : "http://localhost/"),
    });

    public HttpClient WithBearer(string token)
    {
        var client = CreateClient(new WebApplicationFactoryClientOptions { AllowAutoRedirect = false });
        client.DefaultRequestHeaders.Authorization = new System.Net.Http.Headers.AuthenticationHeaderValue("Bearer", token);
        return client;
    }

    /// <summary>A hub connection over WebSockets, sending the given Origin and bearer token (either may be null).</summary>
    public Task<HubConnection> ConnectAsync(string? origin, string? token) => TestHubConnections.ConnectAsync(Server, request =>
    {
        if (origin is not null) request.Headers.Origin = origin;
        if (token is not null) request.Headers.Authorization = $"Bearer {token}";
    });
}
