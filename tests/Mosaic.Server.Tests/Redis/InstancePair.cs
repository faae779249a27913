using System.Net;
using System.Net.Http.Json;
using System.Text.Json;

namespace Mosaic.Server.Tests.Redis;

/// <summary>Two server instances, A and B, on the same data and the same Redis but each with its own cache folder, as behind a load balancer.</summary>
public sealed class InstancePair : IAsyncDisposable
{
    public InstancePair(ServerDataFixture data, RedisServer redis)
    {
        FactoryA = new RedisInstanceFactory(data.DataDirectory, data.NewCacheDirectory(), redis.Configuration);
        FactoryB = new RedisInstanceFactory(data.DataDirectory, data.NewCacheDirectory(), redis.Configuration);
        A = FactoryA.CreateClient();
        B = FactoryB.CreateClient();
    }

    public RedisInstanceFactory FactoryA { get; }

    public RedisInstanceFactory FactoryB { get; }

    public HttpClient A { get; }

    public HttpClient B { get; }

    public async Task WaitForPyramidsAsync(string field)
    {
        await MosaicFactory.WaitForPyramidsAsync(A, field);
        await MosaicFactory.WaitForPyramidsAsync(B, field);
    }

    /// <summary>GETs a tile; returns its status, the tier that answered (X-Tile-Cache) and the bytes.</summary>
    public static async Task<(HttpStatusCode Status, string? Tier, byte[] Bytes)> TileAsync(HttpClient client, string url)
    {
        using var response = await client.GetAsync(url);
        var tier = response.Headers.TryGetValues("X-Tile-Cache", out var values) ? values.Single() : null;
        return (response.StatusCode, tier, await response.Content.ReadAsByteArrayAsync());
    }

    /// <summary>The /healthz answer: its HTTP status and its 'redis' member.</summary>
    public static async Task<(HttpStatusCode Status, string? Redis)> HealthAsync(HttpClient client)
    {
        using var response = await client.GetAsync("/healthz");
        var body = await response.Content.ReadFromJsonAsync<JsonElement>();
        Assert.Equal("ok", body.GetProperty("status").GetString());
        return (response.StatusCode, body.GetProperty("redis").GetString());
    }

    /// <summary>Polls /healthz until it names <paramref name="redis"/>; fails with the last answer after <paramref name="within"/>.</summary>
    public static async Task WaitForRedisAsync(HttpClient client, string redis, TimeSpan within)
    {
        var deadline = DateTime.UtcNow + within;
        while (true)
        {
            var (status, said) = await HealthAsync(client);
            Assert.Equal(HttpStatusCode.OK, status);
            if (said == redis) return;
            if (DateTime.UtcNow > deadline) throw new TimeoutException($"/healthz still said redis '{said}' after {within.TotalSeconds} s, not '{redis}'");
            await Task.Delay(100);
        }
    }

    public async ValueTask DisposeAsync()
    {
        A.Dispose();
        B.Dispose();
        await FactoryA.DisposeAsync();
        await FactoryB.DisposeAsync();
    }
}
