using System.Net;
using Mosaic.Server.Tests.Meetings;

namespace Mosaic.Server.Tests.Redis;

/// <summary>
/// Redis killed under two running instances: both keep serving tiles from their own tiers and say so on /healthz
/// (still 200); once Redis is back they say so again and share again.
/// </summary>
public sealed class RedisOutageTests(ServerDataFixture data) : IClassFixture<ServerDataFixture>, IDisposable
{
    private static readonly TimeSpan Notice = TimeSpan.FromSeconds(15);
    private readonly RedisServer _redis = RedisServer.Start();

    [Fact]
    public async Task With_Redis_stopped_both_instances_serve_tiles_and_report_it_down_then_up_after_a_restart()
    {
        await using var pair = new InstancePair(data, _redis);
        await pair.WaitForPyramidsAsync("single");
        Assert.Equal((HttpStatusCode.OK, "up"), await InstancePair.HealthAsync(pair.A));
        Assert.Equal((HttpStatusCode.OK, "up"), await InstancePair.HealthAsync(pair.B));
        const string before = "/tiles/single/0/0/0.png?stretch=linear";
        Assert.Equal("rendered", (await InstancePair.TileAsync(pair.A, before)).Tier);
        Assert.Equal("shared", (await InstancePair.TileAsync(pair.B, before)).Tier);

        _redis.Stop();
        await InstancePair.WaitForRedisAsync(pair.A, "down", Notice);
        await InstancePair.WaitForRedisAsync(pair.B, "down", Notice);

        // Tiles already held locally, and new ones rendered locally: all 200.
        foreach (var client in new[] { pair.A, pair.B })
        {
            var (status, tier, _) = await InstancePair.TileAsync(client, before);
            Assert.Equal(HttpStatusCode.OK, status);
            Assert.Equal("memory", tier);
        }
        const string during = "/tiles/single/0/0/0.png?stretch=log";
        foreach (var client in new[] { pair.A, pair.B })
        {
            var (status, tier, bytes) = await InstancePair.TileAsync(client, during);
            Assert.Equal(HttpStatusCode.OK, status);
            Assert.Equal("rendered", tier);
            Assert.Equal(0x89, bytes[0]); // PNG signature, RFC 2083 section 3.1 (from memory: 89 50 4E 47)
        }

        // Meetings live in Redis: while it is away, starting one is refused with 503 problem details, not a 500.
        using var refused = await MeetingRequests.PostAsync(pair.A, new { state = MeetingRequests.State() });
        Assert.Equal(HttpStatusCode.ServiceUnavailable, refused.StatusCode);
        Assert.Equal("application/problem+json", refused.Content.Headers.ContentType?.MediaType);

        _redis.Restart();
        await InstancePair.WaitForRedisAsync(pair.A, "up", Notice);
        await InstancePair.WaitForRedisAsync(pair.B, "up", Notice);

        const string after = "/tiles/single/0/0/0.png?stretch=sqrt";
        Assert.Equal("rendered", (await InstancePair.TileAsync(pair.A, after)).Tier);
        Assert.Equal("shared", (await InstancePair.TileAsync(pair.B, after)).Tier);
        await MeetingRequests.StartAsync(pair.B, MeetingRequests.State());
    }

    [Fact]
    public async Task A_server_started_while_Redis_is_down_serves_tiles_and_shares_once_Redis_appears()
    {
        using var absent = RedisServer.NotStarted();
        await using var pair = new InstancePair(data, absent);
        await pair.WaitForPyramidsAsync("single");
        Assert.Equal((HttpStatusCode.OK, "down"), await InstancePair.HealthAsync(pair.A));
        var (status, tier, _) = await InstancePair.TileAsync(pair.A, "/tiles/single/0/0/0.png?stretch=linear");
        Assert.Equal(HttpStatusCode.OK, status);
        Assert.Equal("rendered", tier);

        absent.Restart();
        await InstancePair.WaitForRedisAsync(pair.A, "up", Notice);
        await InstancePair.WaitForRedisAsync(pair.B, "up", Notice);
        Assert.Equal("rendered", (await InstancePair.TileAsync(pair.A, "/tiles/single/0/0/0.png?stretch=sqrt")).Tier);
        Assert.Equal("shared", (await InstancePair.TileAsync(pair.B, "/tiles/single/0/0/0.png?stretch=sqrt")).Tier);
    }

    public void Dispose() => _redis.Dispose();
}
