using System.Text.Json;
using Microsoft.AspNetCore.SignalR;

namespace Mosaic.Server.Meetings;

/// <summary>
/// Live meetings. Server to client: "view" (the presenter's state), "pointer" ({x, y} or null), "presenter" (someone
/// took over), "participants" (the count) and "ended". A presenter's messages go to everyone else in the meeting.
/// </summary>
public sealed class MeetingHub(IMeetingStore store, MeetingStateReader states) : Hub
{
    public const string Path = "/hubs/meeting";

    /// <summary>Joins meeting <paramref name="id"/> (again, after a reconnect) and returns its current view state.</summary>
    public async Task<IReadOnlyDictionary<string, string>> Join(string id)
    {
        var joined = store.Join(id, Context.ConnectionId);
        if (joined.Left is { } left)
        {
            await Groups.RemoveFromGroupAsync(Context.ConnectionId, Group(left.MeetingId));
            await Clients.Group(Group(left.MeetingId)).SendAsync("participants", left.Participants);
        }
        await Groups.AddToGroupAsync(Context.ConnectionId, Group(id));
        await Clients.Group(Group(id)).SendAsync("participants", joined.Participants);
        return joined.State;
    }

    public async Task Present(string id, string key, JsonElement state)
    {
        var map = states.Read(state);
        store.Present(id, key, map);
        await Clients.OthersInGroup(Group(id)).SendAsync("view", map);
    }

    public async Task Point(string id, string key, JsonElement pointer)
    {
        var at = MeetingPointerReader.Read(pointer);
        store.Authorize(id, key);
        await Clients.OthersInGroup(Group(id)).SendAsync("pointer", at);
    }

    public string HandOver(string id, string key) => store.HandOver(id, key);

    public async Task<string> TakeOver(string id, string code)
    {
        var key = store.TakeOver(id, code);
        await Clients.OthersInGroup(Group(id)).SendAsync("presenter", new MeetingPresenterDto(null));
        return key;
    }

    public async Task End(string id, string key)
    {
        store.End(id, key);
        await Clients.Group(Group(id)).SendAsync("ended");
    }

    public override async Task OnDisconnectedAsync(Exception? exception)
    {
        if (store.Leave(Context.ConnectionId) is { } left)
            await Clients.Group(Group(left.MeetingId)).SendAsync("participants", left.Participants);
        await base.OnDisconnectedAsync(exception);
    }

    private static string Group(string id) => $"meeting:{id}";
}
