using Mosaic.Server.Errors;
using Mosaic.Server.Meetings;
using Mosaic.Server.Tests.Meetings;

namespace Mosaic.Server.Tests.Redis;

/// <summary>
/// The Redis meeting store against a real Redis. Its rules are those of the in-memory store (the IMeetingStore
/// contract of the meetings issue): the same scenario is played on both and must end the same way. Racing two
/// instances checks that each operation is atomic.
/// </summary>
public sealed class RedisMeetingStoreTests : IDisposable
{
    private static readonly MeetingLimits Small = new()
    {
        MaxMeetings = 3,
        MaxParticipants = 2,
        Expiry = TimeSpan.FromHours(2),
        HandOverLifetime = TimeSpan.FromMinutes(10),
    };

    private readonly RedisServer _redis = RedisServer.Start();
    private readonly ManualClock _clock = new();

    [Fact]
    public void The_same_scenario_ends_the_same_way_as_in_the_in_memory_store()
    {
        using var host = new RedisStoreHost(_redis, Small, _clock);
        var redisLog = Play(host.Store, _clock);
        var memoryClock = new ManualClock();
        var memoryLog = Play(new InMemoryMeetingStore(Small, memoryClock), memoryClock);
        Assert.Equal(memoryLog, redisLog);
        // The scenario does reach the refusals it is meant to compare, not only successes.
        Assert.Contains(redisLog, line => line.Contains("Full", StringComparison.Ordinal));
        Assert.Contains(redisLog, line => line.Contains("WrongKey", StringComparison.Ordinal));
        Assert.Contains(redisLog, line => line.Contains("idle for too long", StringComparison.Ordinal));
        Assert.Contains(redisLog, line => line.Contains("has expired", StringComparison.Ordinal));
    }

    [Fact]
    public async Task Two_instances_racing_for_the_last_places_never_exceed_the_limit()
    {
        using var a = new RedisStoreHost(_redis, Small, _clock);
        using var b = new RedisStoreHost(_redis, Small, _clock);
        var attempts = Enumerable.Range(0, 20).Select(i => Task.Run(() =>
        {
            try
            {
                (i % 2 == 0 ? a : b).Store.Start(MeetingRequests.State());
                return true;
            }
            catch (MeetingException e) when (e.Error == MeetingError.Full)
            {
                return false;
            }
        }));
        var started = (await Task.WhenAll(attempts)).Count(ok => ok);
        Assert.Equal(Small.MaxMeetings, started);
        Assert.Equal(Small.MaxMeetings, a.Store.Count);
        Assert.Equal(Small.MaxMeetings, int.Parse(_redis.Cli("ZCARD", "mosaic:meet:index"), System.Globalization.CultureInfo.InvariantCulture));
    }

    [Fact]
    public async Task One_hand_over_code_raced_from_two_instances_is_taken_once()
    {
        using var a = new RedisStoreHost(_redis, Small, _clock);
        using var b = new RedisStoreHost(_redis, Small, _clock);
        var (id, key) = a.Store.Start(MeetingRequests.State());
        var code = a.Store.HandOver(id, key);

        var takes = Enumerable.Range(0, 8).Select(i => Task.Run(() =>
        {
            try
            {
                return (i % 2 == 0 ? a : b).Store.TakeOver(id, code);
            }
            catch (MeetingException e) when (e.Error == MeetingError.WrongKey)
            {
                return null;
            }
        }));
        var keys = (await Task.WhenAll(takes)).OfType<string>().ToList();
        var winner = Assert.Single(keys);
        b.Store.Authorize(id, winner);
        Assert.Equal(MeetingError.WrongKey, Assert.Throws<MeetingException>(() => a.Store.Authorize(id, key)).Error);
    }

    [Fact]
    public void A_participant_limit_holds_across_instances_and_a_leave_on_one_frees_a_place_on_the_other()
    {
        using var a = new RedisStoreHost(_redis, Small, _clock);
        using var b = new RedisStoreHost(_redis, Small, _clock);
        var (id, _) = a.Store.Start(MeetingRequests.State());
        Assert.Equal(1, a.Store.Join(id, "conn-a1").Participants);
        Assert.Equal(2, b.Store.Join(id, "conn-b1").Participants);
        Assert.Equal(MeetingError.Full, Assert.Throws<MeetingException>(() => b.Store.Join(id, "conn-b2")).Error);
        // Joining again is not a new place.
        Assert.Equal(2, b.Store.Join(id, "conn-b1").Participants);

        Assert.Equal(new MeetingMembership(id, 1), a.Store.Leave("conn-a1"));
        Assert.Null(a.Store.Leave("conn-a1"));
        Assert.Equal(2, b.Store.Join(id, "conn-b2").Participants);
    }

    [Fact]
    public void With_Redis_unreachable_every_operation_is_a_503_not_a_missing_meeting()
    {
        using var host = new RedisStoreHost(_redis, Small, _clock);
        var (id, key) = host.Store.Start(MeetingRequests.State());
        _redis.Stop();
        var deadline = DateTime.UtcNow + TimeSpan.FromSeconds(15);
        while (host.Connection.IsConnected && DateTime.UtcNow < deadline) Thread.Sleep(50);
        Assert.False(host.Connection.IsConnected);

        foreach (var operation in new Action[]
                 {
                     () => host.Store.Start(MeetingRequests.State()),
                     () => host.Store.Join(id, "conn-1"),
                     () => host.Store.Present(id, key, MeetingRequests.State()),
                     () => _ = host.Store.Count,
                 })
            Assert.Equal(503, Assert.Throws<MosaicRequestException>(operation).Status);
    }

    /// <summary>Runs a fixed scenario and writes down what each step answered, so two stores can be compared.</summary>
    private static List<string> Play(IMeetingStore store, ManualClock clock)
    {
        var log = new List<string>();
        void Step(string name, Func<object?> step)
        {
            try
            {
                log.Add($"{name}: {Describe(step())}");
            }
            catch (MeetingException e)
            {
                log.Add($"{name}: {e.Error} {e.Parameter} {e.Message}");
            }
        }

        var first = store.Start(MeetingRequests.State(x: "10"));
        var second = store.Start(MeetingRequests.State(x: "20"));
        // Ids are random: the log names them by role.
        string Name(string text) => text.Replace(first.Id, "FIRST").Replace(second.Id, "SECOND");

        Step("count", () => store.Count);
        Step("join 1", () => store.Join(first.Id, "c1"));
        Step("join 2", () => store.Join(first.Id, "c2"));
        Step("join 3 full", () => store.Join(first.Id, "c3"));
        Step("join 1 again", () => store.Join(first.Id, "c1"));
        Step("move 1 to second", () => store.Join(second.Id, "c1"));
        Step("join 3 now", () => store.Join(first.Id, "c3"));
        Step("present", () => { store.Present(first.Id, first.PresenterKey, MeetingRequests.State(x: "99")); return null; });
        Step("present wrong key", () => { store.Present(first.Id, second.PresenterKey, MeetingRequests.State()); return null; });
        Step("join sees new state", () => store.Join(first.Id, "c2"));
        Step("bad id", () => store.Join("no", "c4"));
        Step("unknown id", () => store.Join("abcdefghijkl", "c4"));
        Step("third", () => store.Start(MeetingRequests.State()) is { } s ? "started" : null);
        Step("fourth full", () => store.Start(MeetingRequests.State()) is { } s ? "started" : null);

        var code = store.HandOver(first.Id, first.PresenterKey);
        clock.Advance(Small.HandOverLifetime + TimeSpan.FromSeconds(1));
        Step("take over late", () => store.TakeOver(first.Id, code));
        var fresh = store.HandOver(first.Id, first.PresenterKey);
        Step("take over wrong code", () => store.TakeOver(first.Id, fresh + "x"));
        string? taken = null;
        Step("take over", () => { taken = store.TakeOver(first.Id, fresh); return "taken"; });
        Step("take over twice", () => store.TakeOver(first.Id, fresh));
        Step("old key", () => { store.Authorize(first.Id, first.PresenterKey); return null; });
        Step("new key", () => { store.Authorize(first.Id, taken!); return null; });

        // The second meeting's presenter has been idle since the start; the first's just acted.
        clock.Advance(Small.Expiry - Small.HandOverLifetime);
        Step("second expired", () => store.Join(second.Id, "c5"));
        Step("first alive", () => store.Join(first.Id, "c5"));
        Step("count after expiry", () => store.Count);
        Step("end wrong key", () => { store.End(first.Id, first.PresenterKey); return null; });
        Step("end", () => { store.End(first.Id, taken!); return null; });
        Step("leave after end", () => store.Leave("c2"));
        Step("ended", () => store.Join(first.Id, "c2"));
        Step("count at end", () => store.Count);
        return log.Select(Name).ToList();
    }

    private static string Describe(object? value) => value switch
    {
        null => "null",
        MeetingJoined j => $"joined x={j.State["x"]} n={j.Participants} left={j.Left}",
        _ => value.ToString()!,
    };

    public void Dispose() => _redis.Dispose();
}
