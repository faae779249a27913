using System.Net;

namespace Mosaic.Server.Tests.Redis;

/// <summary>Without --redis, /healthz says so and nothing tries to reach a Redis.</summary>
public sealed class HealthWithoutRedisTests(ServerDataFixture data) : IClassFixture<ServerDataFixture>
{
    [Fact]
    public async Task Health_says_redis_off_and_tiles_come_from_this_instance()
    {
        await using var factory = new MosaicFactory(data.DataDirectory, data.NewCacheDirectory());
        using var client = factory.CreateClient();
        Assert.Equal((HttpStatusCode.OK, "off"), await InstancePair.HealthAsync(client));
        await MosaicFactory.WaitForPyramidsAsync(client, "single");
        Assert.Equal("rendered", (await InstancePair.TileAsync(client, "/tiles/single/0/0/0.png")).Tier);
        Assert.Equal("memory", (await InstancePair.TileAsync(client, "/tiles/single/0/0/0.png")).Tier);
    }
}
