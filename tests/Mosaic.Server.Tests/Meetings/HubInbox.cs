using System.Collections.Concurrent;
using System.Text.Json;
using System.Threading.Channels;
using Microsoft.AspNetCore.SignalR.Client;

namespace Mosaic.Server.Tests.Meetings;

/// <summary>Everything the server sent one connection, by message name, with waits for the next of each.</summary>
public sealed class HubInbox
{
    // Generous: on a loaded 2-core machine a disconnect can take seconds to reach the hub; a pass is never slower for it.
    private static readonly TimeSpan Wait = TimeSpan.FromSeconds(30);
    private readonly ConcurrentDictionary<string, Channel<JsonElement?>> _messages = new();

    public HubInbox(HubConnection connection)
    {
        connection.On<JsonElement?>("view", m => Post("view", m));
        connection.On<JsonElement?>("pointer", m => Post("pointer", m));
        connection.On<JsonElement?>("presenter", m => Post("presenter", m));
        connection.On<int>("participants", n => Post("participants", JsonSerializer.SerializeToElement(n)));
        connection.On("ended", () => Post("ended", null));
    }

    /// <summary>The next message of that name; fails the test after thirty seconds without one.</summary>
    public async Task<JsonElement?> NextAsync(string name)
    {
        using var timeout = new CancellationTokenSource(Wait);
        try
        {
            return await Queue(name).Reader.ReadAsync(timeout.Token);
        }
        catch (OperationCanceledException)
        {
            throw new TimeoutException($"no '{name}' message within {Wait.TotalSeconds} s");
        }
    }

    /// <summary>Waits until the participant count sent is <paramref name="count"/> (earlier counts are skipped).</summary>
    public async Task WaitForParticipantsAsync(int count)
    {
        while ((await NextAsync("participants"))!.Value.GetInt32() != count) { }
    }

    /// <summary>Whether a message of that name arrives within <paramref name="within"/>.</summary>
    public async Task<bool> ReceivesAsync(string name, TimeSpan within)
    {
        using var timeout = new CancellationTokenSource(within);
        try
        {
            await Queue(name).Reader.ReadAsync(timeout.Token);
            return true;
        }
        catch (OperationCanceledException)
        {
            return false;
        }
    }

    private void Post(string name, JsonElement? message) => Queue(name).Writer.TryWrite(message);

    private Channel<JsonElement?> Queue(string name) => _messages.GetOrAdd(name, _ => Channel.CreateUnbounded<JsonElement?>());
}
