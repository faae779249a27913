using System.Net;
using Microsoft.AspNetCore.SignalR;
using Microsoft.AspNetCore.SignalR.Client;
using Mosaic.Server.Meetings;

namespace Mosaic.Server.Tests.Meetings;

/// <summary>The bounds that keep meetings from growing without end (common practice for a shared server), on small limits and a hand-moved clock.</summary>
public sealed class MeetingLimitTests(ServerDataFixture data) : IClassFixture<ServerDataFixture>
{
    private static readonly MeetingLimits Small = new()
    {
        MaxMeetings = 2,
        MaxParticipants = 2,
        Expiry = TimeSpan.FromHours(2),
        HandOverLifetime = TimeSpan.FromMinutes(10),
        MaxMessageBytes = 4 * 1024,
    };

    [Fact]
    public async Task No_more_meetings_than_the_limit_until_one_ends()
    {
        await using var factory = new MeetingFactory(data.DataDirectory, data.NewCacheDirectory(), Small, new ManualClock());
        using var client = factory.CreateClient();
        var (id, key) = await MeetingRequests.StartAsync(client, MeetingRequests.State());
        await MeetingRequests.StartAsync(client, MeetingRequests.State());

        using var refused = await MeetingRequests.PostAsync(client, new { state = MeetingRequests.State() });
        Assert.Equal(HttpStatusCode.ServiceUnavailable, refused.StatusCode);
        Assert.Contains("2 meetings", await refused.Content.ReadAsStringAsync());

        await using var presenter = await factory.ConnectAsync();
        await presenter.InvokeAsync("End", id, key);
        await MeetingRequests.StartAsync(client, MeetingRequests.State());
    }

    [Fact]
    public async Task No_more_participants_than_the_limit_and_a_place_frees_when_one_leaves()
    {
        await using var factory = new MeetingFactory(data.DataDirectory, data.NewCacheDirectory(), Small, new ManualClock());
        using var client = factory.CreateClient();
        var (id, _) = await MeetingRequests.StartAsync(client, MeetingRequests.State());
        await using var first = await factory.ConnectAsync();
        var firstInbox = new HubInbox(first);
        var second = await factory.ConnectAsync();
        await using var third = await factory.ConnectAsync();
        await first.InvokeAsync<Dictionary<string, string>>("Join", id);
        await second.InvokeAsync<Dictionary<string, string>>("Join", id);

        var full = await Assert.ThrowsAsync<HubException>(() => third.InvokeAsync<Dictionary<string, string>>("Join", id));
        Assert.Contains("2 participants", full.Message);

        await second.DisposeAsync();
        await firstInbox.WaitForParticipantsAsync(1);
        await third.InvokeAsync<Dictionary<string, string>>("Join", id);
        await firstInbox.WaitForParticipantsAsync(2);
    }

    [Fact]
    public async Task A_meeting_expires_after_the_presenter_is_idle_for_the_expiry_and_activity_keeps_it_open()
    {
        var clock = new ManualClock();
        await using var factory = new MeetingFactory(data.DataDirectory, data.NewCacheDirectory(), Small, clock);
        using var client = factory.CreateClient();
        var (id, key) = await MeetingRequests.StartAsync(client, MeetingRequests.State());
        await using var presenter = await factory.ConnectAsync();

        // Pointer moves count as activity: 1 h 30 min, a move, 1 h 30 min more is still open.
        clock.Advance(TimeSpan.FromMinutes(90));
        await presenter.InvokeAsync("Point", id, key, new { x = 3.0, y = 4.0 });
        clock.Advance(TimeSpan.FromMinutes(90));
        await presenter.InvokeAsync<Dictionary<string, string>>("Join", id);

        // Joining is not presenter activity: 2 h and a minute after the move, it is gone.
        clock.Advance(TimeSpan.FromMinutes(31));
        var expired = await Assert.ThrowsAsync<HubException>(() => presenter.InvokeAsync("Present", id, key, MeetingRequests.State()));
        Assert.Contains("idle", expired.Message);
    }

    [Fact]
    public async Task A_hand_over_code_stops_working_after_its_lifetime()
    {
        var clock = new ManualClock();
        await using var factory = new MeetingFactory(data.DataDirectory, data.NewCacheDirectory(), Small, clock);
        using var client = factory.CreateClient();
        var (id, key) = await MeetingRequests.StartAsync(client, MeetingRequests.State());
        await using var presenter = await factory.ConnectAsync();
        var code = await presenter.InvokeAsync<string>("HandOver", id, key);

        clock.Advance(TimeSpan.FromMinutes(11));
        var late = await Assert.ThrowsAsync<HubException>(() => presenter.InvokeAsync<string>("TakeOver", id, code));
        Assert.Contains("expired", late.Message);
        // The presenter still drives, and a fresh code works.
        var fresh = await presenter.InvokeAsync<string>("HandOver", id, key);
        Assert.NotEqual(code, fresh);
        Assert.NotEqual(key, await presenter.InvokeAsync<string>("TakeOver", id, fresh));
    }

    [Fact]
    public async Task A_message_over_the_hub_limit_closes_the_connection()
    {
        await using var factory = new MeetingFactory(data.DataDirectory, data.NewCacheDirectory(), Small, new ManualClock());
        using var client = factory.CreateClient();
        var (id, key) = await MeetingRequests.StartAsync(client, MeetingRequests.State());
        await using var presenter = await factory.ConnectAsync();
        var closed = new TaskCompletionSource<Exception?>();
        presenter.Closed += e => { closed.TrySetResult(e); return Task.CompletedTask; };

        var big = MeetingRequests.State();
        big["note"] = new string('n', 8 * 1024);
        // SignalR refuses a message over MaximumReceiveMessageSize by closing the connection (ASP.NET Core SignalR docs, HubOptions).
        await Assert.ThrowsAnyAsync<Exception>(() => presenter.InvokeAsync("Present", id, key, big));
        var done = await Task.WhenAny(closed.Task, Task.Delay(TimeSpan.FromSeconds(10)));
        Assert.Same(closed.Task, done);
        Assert.Equal(HubConnectionState.Disconnected, presenter.State);
    }
}
