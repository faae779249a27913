using System.Net;

namespace Mosaic.Server.Tests.Access;

/// <summary>
/// Meeting connections check Origin (RFC 6454 origins; RFC 6455 section 10.2: a WebSocket server should check the
/// Origin its clients' browsers send), refusing foreign ones with 403.
/// </summary>
public sealed class OriginTests(AccessFixture fixture) : IClassFixture<AccessFixture>
{
    [Theory]
    [InlineData(null, HttpStatusCode.OK)]
    [InlineData("http://localhost", HttpStatusCode.OK)]
    [InlineData("http://LOCALHOST", HttpStatusCode.OK)]
    [InlineData("https://localhost", HttpStatusCode.Forbidden)]
    [InlineData("http://localhost:8080", HttpStatusCode.Forbidden)]
    [InlineData("http://elsewhere.example", HttpStatusCode.Forbidden)]
    [InlineData("https://partner.example:8443", HttpStatusCode.OK)]
    [InlineData("null", HttpStatusCode.Forbidden)]
    public async Task Negotiating_a_meeting_connection_needs_this_servers_origin_or_a_listed_one(string? origin, HttpStatusCode expected)
    {
        using var factory = new AccessFactory(fixture, new Dictionary<string, string> { ["allowed-origins"] = "https://partner.example:8443" });
        using var client = factory.CreateClient();
        using var request = new HttpRequestMessage(HttpMethod.Post, "/hubs/meeting/negotiate?negotiateVersion=1");
        if (origin is not null) request.Headers.Add("Origin", origin);
        using var response = await client.SendAsync(request);
        Assert.Equal(expected, response.StatusCode);
    }

    [Fact]
    public async Task A_websocket_from_a_foreign_page_is_refused_and_one_from_this_server_joins()
    {
        using var factory = new AccessFactory(fixture, new Dictionary<string, string>());
        var refused = await Assert.ThrowsAnyAsync<Exception>(() => factory.ConnectAsync("http://elsewhere.example", token: null));
        Assert.Contains("403", refused.Message);
        await using var own = await factory.ConnectAsync("http://localhost", token: null);
        Assert.Equal(Microsoft.AspNetCore.SignalR.Client.HubConnectionState.Connected, own.State);
    }

    [Fact]
    public async Task With_a_token_required_the_hub_needs_it_as_well()
    {
        using var factory = new AccessFactory(fixture, fixture.TokenSettings());
        var anonymous = await Assert.ThrowsAnyAsync<Exception>(() => factory.ConnectAsync("http://localhost", token: null));
        Assert.Contains("401", anonymous.Message);
        await using var holder = await factory.ConnectAsync("http://localhost", AccessFixture.Token);
        Assert.Equal(Microsoft.AspNetCore.SignalR.Client.HubConnectionState.Connected, holder.State);
    }
}
