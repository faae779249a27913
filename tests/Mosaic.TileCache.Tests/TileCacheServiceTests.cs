using Mosaic.TileCache;

namespace Mosaic.TileCache.Tests;

public sealed class TileCacheServiceTests
{
    [Fact]
    public async Task Concurrent_requests_for_a_missing_tile_render_it_once()
    {
        using var store = new MemoryTileStore(new MemoryTileStoreOptions());
        var service = new TileCacheService(store);
        var renders = 0;
        using var gate = new ManualResetEventSlim();
        byte[] Render()
        {
            Interlocked.Increment(ref renders);
            gate.Wait(TimeSpan.FromSeconds(10)); // hold the first render until every request is waiting on it
            return [42];
        }

        var requests = Enumerable.Range(0, 32).Select(_ => service.GetOrCreateAsync("k", Render).AsTask()).ToArray();
        await Task.Delay(100);
        gate.Set();
        var results = await Task.WhenAll(requests);

        Assert.Equal(1, renders);
        Assert.All(results, r => Assert.Equal([42], r.Bytes));
        var (_, hit) = await service.GetOrCreateAsync("k", Render);
        Assert.True(hit);
        Assert.Equal(1, renders);
    }

    [Fact]
    public async Task A_failed_render_is_not_kept_and_the_next_request_tries_again()
    {
        using var store = new MemoryTileStore(new MemoryTileStoreOptions());
        var service = new TileCacheService(store);
        await Assert.ThrowsAsync<InvalidOperationException>(async () => await service.GetOrCreateAsync("k", () => throw new InvalidOperationException("boom")));
        Assert.False(store.TryGet("k", out _));
        var (bytes, hit) = await service.GetOrCreateAsync("k", () => [7]);
        Assert.False(hit);
        Assert.Equal([7], bytes);
    }
}
