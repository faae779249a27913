using Microsoft.AspNetCore.Http;
using Microsoft.AspNetCore.Http.Connections;
using Microsoft.AspNetCore.SignalR.Client;
using Microsoft.AspNetCore.TestHost;
using Mosaic.Server.Meetings;

namespace Mosaic.Server.Tests.Meetings;

/// <summary>Meeting hub connections to an in-memory test server.</summary>
public static class TestHubConnections
{
    /// <summary>
    /// A started hub connection over WebSockets through <paramref name="server"/>; <paramref name="configureRequest"/>
    /// may set headers (Origin, Authorization) on the upgrade request.
    /// </summary>
    public static async Task<HubConnection> ConnectAsync(TestServer server, Action<HttpRequest>? configureRequest = null)
    {
        var connection = new HubConnectionBuilder()
            .WithUrl(new Uri(server.BaseAddress, MeetingHub.Path.TrimStart('/')), options =>
            {
                options.Transports = HttpTransportType.WebSockets;
                options.SkipNegotiation = true;
                options.WebSocketFactory = async (context, cancel) =>
                {
                    var client = server.CreateWebSocketClient();
                    if (configureRequest is not null) client.ConfigureRequest = configureRequest;
                    return await client.ConnectAsync(context.Uri, cancel);
                };
            })
            .Build();
        await connection.StartAsync();
        return connection;
    }
}
