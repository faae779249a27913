using System.Globalization;
using Microsoft.AspNetCore.SignalR.Client;
using Mosaic.Server.Tests.Meetings;

namespace Mosaic.Server.Tests.Redis;

/// <summary>
/// A meeting across two instances on one real Redis, through the SignalR .NET client as the page uses the hub:
/// the meeting store and the hub messages both cross over. Membership is also read with redis-cli.
/// </summary>
public sealed class SharedMeetingTests(ServerDataFixture data) : IClassFixture<ServerDataFixture>, IDisposable
{
    private readonly RedisServer _redis = RedisServer.Start();

    [Fact]
    public async Task A_follower_on_one_instance_follows_a_presenter_on_the_other()
    {
        await using var pair = new InstancePair(data, _redis);
        var start = MeetingRequests.State();
        var (id, key) = await MeetingRequests.StartAsync(pair.A, start);

        await using var presenter = await pair.FactoryA.ConnectAsync();
        var presenterInbox = new HubInbox(presenter);
        await using var follower = await pair.FactoryB.ConnectAsync();
        var followerInbox = new HubInbox(follower);

        Assert.Equal(start, await presenter.InvokeAsync<Dictionary<string, string>>("Join", id));
        // B never saw the meeting start: the state comes from the shared store.
        Assert.Equal(start, await follower.InvokeAsync<Dictionary<string, string>>("Join", id));
        await followerInbox.WaitForParticipantsAsync(2);
        await presenterInbox.WaitForParticipantsAsync(2);
        Assert.Equal("2", _redis.Cli("SCARD", $"mosaic:meet:m:{id}:c"));

        var moved = MeetingRequests.State(x: "120.5", y: "40.25", z: "3");
        await presenter.InvokeAsync("Present", id, key, moved);
        Assert.Equal(moved, MeetingRequests.ToMap(await followerInbox.NextAsync("view")));

        await presenter.InvokeAsync("Point", id, key, new { x = 7.5, y = 9.0 });
        var pointer = (await followerInbox.NextAsync("pointer"))!.Value;
        Assert.Equal((7.5, 9.0), (pointer.GetProperty("x").GetDouble(), pointer.GetProperty("y").GetDouble()));

        // A late joiner on B starts from the newest state set through A.
        await using var late = await pair.FactoryB.ConnectAsync();
        Assert.Equal(moved, await late.InvokeAsync<Dictionary<string, string>>("Join", id));
        await presenterInbox.WaitForParticipantsAsync(3);
    }

    [Fact]
    public async Task A_hand_over_made_on_one_instance_is_taken_on_the_other_and_the_old_key_stops_working()
    {
        await using var pair = new InstancePair(data, _redis);
        var (id, key) = await MeetingRequests.StartAsync(pair.A, MeetingRequests.State());
        await using var presenter = await pair.FactoryA.ConnectAsync();
        var presenterInbox = new HubInbox(presenter);
        await using var successor = await pair.FactoryB.ConnectAsync();
        await presenter.InvokeAsync<Dictionary<string, string>>("Join", id);
        await successor.InvokeAsync<Dictionary<string, string>>("Join", id);

        var code = await presenter.InvokeAsync<string>("HandOver", id, key);
        var newKey = await successor.InvokeAsync<string>("TakeOver", id, code);
        Assert.NotNull(await presenterInbox.NextAsync("presenter"));
        Assert.NotEqual(key, newKey);

        await Assert.ThrowsAsync<Microsoft.AspNetCore.SignalR.HubException>(() => presenter.InvokeAsync("Present", id, key, MeetingRequests.State(x: "1")));
        // The code was used up on B; using it again on A fails too.
        await Assert.ThrowsAsync<Microsoft.AspNetCore.SignalR.HubException>(() => presenter.InvokeAsync<string>("TakeOver", id, code));

        await successor.InvokeAsync("End", id, newKey);
        await presenterInbox.NextAsync("ended");
        Assert.Equal("0", _redis.Cli("EXISTS", $"mosaic:meet:m:{id}"));
        Assert.Equal("0", _redis.Cli("ZCARD", "mosaic:meet:index"));
        Assert.Equal(0, int.Parse(_redis.Cli("EVAL", "return #redis.call('KEYS', 'mosaic:meet:c:*')", "0"), CultureInfo.InvariantCulture));
    }

    public void Dispose() => _redis.Dispose();
}
