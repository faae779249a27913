using System.Globalization;
using System.Net;

namespace Mosaic.Server.Tests.Redis;

/// <summary>
/// Two instances on one real Redis: what one renders, the other serves from the shared tier. The entry itself is
/// inspected with Redis's own client (redis-cli), outside this project's code.
/// </summary>
public sealed class SharedTileTests(ServerDataFixture data) : IClassFixture<ServerDataFixture>, IDisposable
{
    private readonly RedisServer _redis = RedisServer.Start();

    [Fact]
    public async Task A_tile_rendered_through_one_instance_is_a_shared_hit_through_the_other()
    {
        await using var pair = new InstancePair(data, _redis);
        await pair.WaitForPyramidsAsync("single");
        const string url = "/tiles/single/0/0/0.png?stretch=asinh";

        var (statusA, tierA, bytesA) = await InstancePair.TileAsync(pair.A, url);
        Assert.Equal(HttpStatusCode.OK, statusA);
        Assert.Equal("rendered", tierA);

        var (statusB, tierB, bytesB) = await InstancePair.TileAsync(pair.B, url);
        Assert.Equal(HttpStatusCode.OK, statusB);
        Assert.Equal("shared", tierB);
        Assert.Equal(bytesA, bytesB);

        // A shared hit fills B's own tiers: the next ask stays local.
        Assert.Equal("memory", (await InstancePair.TileAsync(pair.B, url)).Tier);

        // Seen from redis-cli: one tile entry under the tile prefix, holding exactly the PNG, with a time to live no
        // longer than the one-day expiry (RedisTileTierOptions.Expiry).
        var keys = _redis.Cli("--scan", "--pattern", "mosaic:tile:*").Split('\n', StringSplitOptions.RemoveEmptyEntries);
        var key = Assert.Single(keys);
        Assert.Equal(bytesA.Length, int.Parse(_redis.Cli("HSTRLEN", key, "data"), CultureInfo.InvariantCulture));
        var ttl = long.Parse(_redis.Cli("TTL", key), CultureInfo.InvariantCulture);
        Assert.InRange(ttl, 1, (long)TimeSpan.FromDays(1).TotalSeconds);
    }

    [Fact]
    public async Task Different_display_settings_are_different_shared_entries()
    {
        await using var pair = new InstancePair(data, _redis);
        await pair.WaitForPyramidsAsync("single");

        Assert.Equal("rendered", (await InstancePair.TileAsync(pair.A, "/tiles/single/0/0/0.png?stretch=linear")).Tier);
        // Same tile, other stretch: B must render it, not take A's.
        var (status, tier, _) = await InstancePair.TileAsync(pair.B, "/tiles/single/0/0/0.png?stretch=sqrt");
        Assert.Equal(HttpStatusCode.OK, status);
        Assert.Equal("rendered", tier);
        Assert.Equal("2", _redis.Cli("EVAL", "return #redis.call('KEYS', 'mosaic:tile:*')", "0"));
    }

    public void Dispose() => _redis.Dispose();
}
