using Microsoft.AspNetCore.SignalR;
using Microsoft.AspNetCore.SignalR.Client;
using Mosaic.Server.Meetings;

namespace Mosaic.Server.Tests.Meetings;

/// <summary>
/// The hub as two or three browsers use it, through the SignalR .NET client against the real server. What each
/// message carries and who receives it is the issue 7 contract; a view state is the link's query parameters.
/// </summary>
public sealed class MeetingHubTests(ServerDataFixture data) : IClassFixture<ServerDataFixture>, IAsyncLifetime
{
    private MeetingFactory _factory = null!;
    private HttpClient _client = null!;

    public Task InitializeAsync()
    {
        _factory = new MeetingFactory(data.DataDirectory, data.NewCacheDirectory());
        _client = _factory.CreateClient();
        return Task.CompletedTask;
    }

    public async Task DisposeAsync()
    {
        _client.Dispose();
        await _factory.DisposeAsync();
    }

    [Fact]
    public async Task A_follower_who_joins_gets_the_current_state_then_every_presenter_view_and_pointer()
    {
        var start = MeetingRequests.State();
        var (id, key) = await MeetingRequests.StartAsync(_client, start);
        await using var presenter = await _factory.ConnectAsync();
        var presenterInbox = new HubInbox(presenter);
        await using var follower = await _factory.ConnectAsync();
        var followerInbox = new HubInbox(follower);

        Assert.Equal(start, await presenter.InvokeAsync<Dictionary<string, string>>("Join", id));
        await presenterInbox.WaitForParticipantsAsync(1);
        Assert.Equal(start, await follower.InvokeAsync<Dictionary<string, string>>("Join", id));
        await followerInbox.WaitForParticipantsAsync(2);
        await presenterInbox.WaitForParticipantsAsync(2);

        // Values pass through untouched, in order, including a marker list joined with newlines.
        var moved = MeetingRequests.State(x: "412.25", y: "87.75", z: "2.5");
        moved["markers"] = "p,10,20\nc,30,40,5";
        await presenter.InvokeAsync("Present", id, key, moved);
        var view = MeetingRequests.ToMap(await followerInbox.NextAsync("view"));
        Assert.Equal(moved, view);
        Assert.Equal(moved.Keys, view.Keys);

        // FITS pixel coordinates (1-based) travel as sent; null when the pointer leaves the image.
        await presenter.InvokeAsync("Point", id, key, new { x = 12.5, y = 300.0 });
        var pointer = (await followerInbox.NextAsync("pointer"))!.Value;
        Assert.Equal((12.5, 300.0), (pointer.GetProperty("x").GetDouble(), pointer.GetProperty("y").GetDouble()));
        await presenter.InvokeAsync("Point", id, key, (object?)null);
        Assert.Equal(System.Text.Json.JsonValueKind.Null, (await followerInbox.NextAsync("pointer"))?.ValueKind ?? System.Text.Json.JsonValueKind.Null);

        // The presenter is not sent its own views back.
        Assert.False(await presenterInbox.ReceivesAsync("view", TimeSpan.FromMilliseconds(300)));

        // A later joiner starts from the newest state, not the one the meeting started with.
        await using var late = await _factory.ConnectAsync();
        Assert.Equal(moved, await late.InvokeAsync<Dictionary<string, string>>("Join", id));
        await followerInbox.WaitForParticipantsAsync(3);
    }

    [Fact]
    public async Task Only_the_presenter_key_drives_and_a_wrong_key_is_a_clear_error()
    {
        var start = MeetingRequests.State();
        var (id, key) = await MeetingRequests.StartAsync(_client, start);
        await using var follower = await _factory.ConnectAsync();
        var inbox = new HubInbox(follower);
        await follower.InvokeAsync<Dictionary<string, string>>("Join", id);

        var wrong = key[..^2] + (key[^2] == 'x' ? "yy" : "xx");
        foreach (var attempt in new Func<Task>[]
                 {
                     () => follower.InvokeAsync("Present", id, wrong, MeetingRequests.State(x: "1")),
                     () => follower.InvokeAsync("Point", id, wrong, new { x = 1.0, y = 1.0 }),
                     () => follower.InvokeAsync<string>("HandOver", id, wrong),
                     () => follower.InvokeAsync("End", id, wrong),
                     () => follower.InvokeAsync("Present", id, "", MeetingRequests.State(x: "1")),
                 })
        {
            var error = await Assert.ThrowsAsync<HubException>(attempt);
            Assert.Contains("presenter key", error.Message);
        }

        // Nothing changed: a new joiner still gets the starting state, and nobody was sent a view.
        await using var other = await _factory.ConnectAsync();
        Assert.Equal(start, await other.InvokeAsync<Dictionary<string, string>>("Join", id));
        Assert.False(await inbox.ReceivesAsync("view", TimeSpan.FromMilliseconds(200)));
    }

    [Fact]
    public async Task Unknown_meetings_bad_states_and_bad_pointers_are_clear_errors()
    {
        var (id, key) = await MeetingRequests.StartAsync(_client, MeetingRequests.State());
        await using var connection = await _factory.ConnectAsync();

        var unknown = await Assert.ThrowsAsync<HubException>(() => connection.InvokeAsync<Dictionary<string, string>>("Join", "AAAAAAAAAAAA"));
        Assert.Contains("no meeting", unknown.Message);
        var malformed = await Assert.ThrowsAsync<HubException>(() => connection.InvokeAsync<Dictionary<string, string>>("Join", "../x"));
        Assert.Contains("meeting id", malformed.Message);

        var notString = await Assert.ThrowsAsync<HubException>(() => connection.InvokeAsync("Present", id, key, new { field = "single", z = 3 }));
        Assert.Contains("'state.z' must be a string", notString.Message);
        var noField = await Assert.ThrowsAsync<HubException>(() => connection.InvokeAsync("Present", id, key, new { field = "elsewhere" }));
        Assert.Contains("'state.field'", noField.Message);
        var badPointer = await Assert.ThrowsAsync<HubException>(() => connection.InvokeAsync("Point", id, key, new { x = "left", y = 1 }));
        Assert.Contains("'pointer.x'", badPointer.Message);
    }

    [Fact]
    public async Task Handing_over_gives_a_one_time_code_and_the_old_key_stops_working()
    {
        var (id, oldKey) = await MeetingRequests.StartAsync(_client, MeetingRequests.State());
        await using var presenter = await _factory.ConnectAsync();
        var presenterInbox = new HubInbox(presenter);
        await using var successor = await _factory.ConnectAsync();
        var successorInbox = new HubInbox(successor);
        await presenter.InvokeAsync<Dictionary<string, string>>("Join", id);
        await successor.InvokeAsync<Dictionary<string, string>>("Join", id);

        var code = await presenter.InvokeAsync<string>("HandOver", id, oldKey);
        Assert.NotEqual(oldKey, code);
        var newKey = await successor.InvokeAsync<string>("TakeOver", id, code);
        Assert.NotEqual(oldKey, newKey);
        Assert.Equal(System.Text.Json.JsonValueKind.Object, (await presenterInbox.NextAsync("presenter"))!.Value.ValueKind);
        Assert.False(await successorInbox.ReceivesAsync("presenter", TimeSpan.FromMilliseconds(200)));

        var stale = await Assert.ThrowsAsync<HubException>(() => presenter.InvokeAsync("Present", id, oldKey, MeetingRequests.State(x: "2")));
        Assert.Contains("handed over", stale.Message);
        var used = await Assert.ThrowsAsync<HubException>(() => presenter.InvokeAsync<string>("TakeOver", id, code));
        Assert.Contains("hand-over code", used.Message);

        // The new presenter drives; the old one now follows.
        var next = MeetingRequests.State(x: "5.5");
        await successor.InvokeAsync("Present", id, newKey, next);
        Assert.Equal(next, MeetingRequests.ToMap(await presenterInbox.NextAsync("view")));
    }

    [Fact]
    public async Task A_connection_that_drops_and_joins_again_gets_the_state_it_missed_and_the_count_follows()
    {
        var (id, key) = await MeetingRequests.StartAsync(_client, MeetingRequests.State());
        await using var presenter = await _factory.ConnectAsync();
        var presenterInbox = new HubInbox(presenter);
        await presenter.InvokeAsync<Dictionary<string, string>>("Join", id);
        var follower = await _factory.ConnectAsync();
        await follower.InvokeAsync<Dictionary<string, string>>("Join", id);
        await presenterInbox.WaitForParticipantsAsync(2);

        await follower.DisposeAsync();
        await presenterInbox.WaitForParticipantsAsync(1);
        var missed = MeetingRequests.State(x: "99", y: "42", z: "3");
        await presenter.InvokeAsync("Present", id, key, missed);

        await using var again = await _factory.ConnectAsync();
        Assert.Equal(missed, await again.InvokeAsync<Dictionary<string, string>>("Join", id));
        await presenterInbox.WaitForParticipantsAsync(2);
    }

    [Fact]
    public async Task Ending_tells_everyone_and_the_meeting_cannot_be_joined_after()
    {
        var (id, key) = await MeetingRequests.StartAsync(_client, MeetingRequests.State());
        await using var presenter = await _factory.ConnectAsync();
        await using var follower = await _factory.ConnectAsync();
        var inbox = new HubInbox(follower);
        await presenter.InvokeAsync<Dictionary<string, string>>("Join", id);
        await follower.InvokeAsync<Dictionary<string, string>>("Join", id);

        await presenter.InvokeAsync("End", id, key);
        Assert.True(await inbox.ReceivesAsync("ended", TimeSpan.FromSeconds(10)));
        var gone = await Assert.ThrowsAsync<HubException>(() => follower.InvokeAsync<Dictionary<string, string>>("Join", id));
        Assert.Contains("no meeting", gone.Message);
    }
}
