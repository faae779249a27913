using System.Net;
using System.Text.Json;
using Microsoft.Extensions.DependencyInjection;
using Mosaic.TileCache.Throttling;

namespace Mosaic.Server.Tests.TileServing;

public sealed class RenderQueueEndpointTests(ServerDataFixture data) : IClassFixture<ServerDataFixture>
{
    [Fact]
    public async Task A_full_render_queue_answers_429_with_Retry_After_while_cached_tiles_still_answer()
    {
        using var factory = new TileServingFactory(data.DataDirectory, data.NewCacheDirectory(), ("render-threads", "1"), ("render-queue", "0"));
        using var client = factory.CreateClient();
        await MosaicFactory.WaitForPyramidsAsync(client, "single");
        var cached = await client.GetAsync("/tiles/single/2/0/0.png");
        Assert.Equal(HttpStatusCode.OK, cached.StatusCode);

        // Occupy the one render slot with real work of our own that waits for the test to let go.
        var queue = factory.Services.GetRequiredService<RenderQueue>();
        Assert.Equal(1, queue.ConcurrentRenders);
        Assert.Equal(0, queue.WaitingRenders);
        using var gate = new ManualResetEventSlim();
        var holder = Task.Run(() => queue.RunAsync(() => gate.Wait(TimeSpan.FromSeconds(30))).AsTask());
        try
        {
            var deadline = DateTime.UtcNow.AddSeconds(20);
            while (queue.Admitted < 1 && DateTime.UtcNow < deadline) await Task.Delay(10);
            Assert.Equal(1, queue.Admitted);

            var refused = await client.GetAsync("/tiles/single/2/1/0.png");
            // RFC 6585 section 4: 429 Too Many Requests; RFC 9110 10.2.3: Retry-After as delay-seconds.
            Assert.Equal(HttpStatusCode.TooManyRequests, refused.StatusCode);
            Assert.Equal(TimeSpan.FromSeconds(1), refused.Headers.RetryAfter?.Delta);
            // RFC 9457 section 3: a problem details object whose status repeats the response's.
            Assert.Equal("application/problem+json", refused.Content.Headers.ContentType?.MediaType);
            using var problem = JsonDocument.Parse(await refused.Content.ReadAsStringAsync());
            Assert.Equal(429, problem.RootElement.GetProperty("status").GetInt32());
            Assert.False(string.IsNullOrWhiteSpace(problem.RootElement.GetProperty("title").GetString()));
            Assert.True(refused.Headers.CacheControl?.NoStore); // RFC 9111 5.2.2.5: the refusal is not stored

            // render.png shares the queue.
            var image = await client.GetAsync("/api/fields/single/render.png?x0=1&y0=1&x1=64&y1=64");
            Assert.Equal(HttpStatusCode.TooManyRequests, image.StatusCode);

            // A tile already cached never waits for a render slot.
            var hit = await client.GetAsync("/tiles/single/2/0/0.png");
            Assert.Equal(HttpStatusCode.OK, hit.StatusCode);
            Assert.Equal("memory", Assert.Single(hit.Headers.GetValues("X-Tile-Cache")));
            Assert.Equal(await cached.Content.ReadAsByteArrayAsync(), await hit.Content.ReadAsByteArrayAsync());
        }
        finally
        {
            gate.Set();
            await holder;
        }

        var afterwards = await client.GetAsync("/tiles/single/2/1/0.png");
        Assert.Equal(HttpStatusCode.OK, afterwards.StatusCode);
        Assert.Equal("rendered", Assert.Single(afterwards.Headers.GetValues("X-Tile-Cache")));
    }
}
