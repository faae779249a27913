using Mosaic.TileCache.Disk;
using Mosaic.TileCache.Throttling;

namespace Mosaic.TileCache.Tests;

/// <summary>
/// The tier order and single-flight rendering. A cache filled from the tier that answered (read-through) and one
/// computation per missing key are common practice; renders are counted by the test's own render functions.
/// </summary>
public sealed class TileCacheServiceTests : IDisposable
{
    private readonly TempFolder _folder = new();

    public void Dispose() => _folder.Dispose();

    private async Task<DiskTileStore> OpenDiskAsync()
    {
        var disk = new DiskTileStore(new DiskTileStoreOptions { Directory = _folder.Path, CapacityBytes = 16L << 20 });
        await disk.IndexRebuilt;
        return disk;
    }

    [Fact]
    public async Task Concurrent_requests_for_a_missing_tile_render_it_once()
    {
        using var memory = new MemoryTileStore(new MemoryTileStoreOptions());
        var shared = new InProcessSharedTier();
        var service = new TileCacheService(memory, await OpenDiskAsync(), shared);
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
        Assert.Equal(1, shared.Gets); // the lower tiers are asked once per flight, not once per request
        var again = await service.GetOrCreateAsync("k", Render);
        Assert.Equal(TileSource.Memory, again.Source);
        Assert.True(again.Hit);
        Assert.Equal(1, renders);
    }

    [Fact]
    public async Task A_render_fills_every_tier_and_each_tier_answers_in_order()
    {
        var disk = await OpenDiskAsync();
        var shared = new InProcessSharedTier();
        using (var memory = new MemoryTileStore(new MemoryTileStoreOptions()))
        {
            var service = new TileCacheService(memory, disk, shared);
            var first = await service.GetOrCreateAsync("t", () => [1, 2, 3]);
            Assert.Equal(TileSource.Rendered, first.Source);
            Assert.False(first.Hit);
            Assert.True(memory.TryGet("t", out _));
            Assert.True(shared.Holds("t"));
            // The disk takes a tile on its second ask only.
            Assert.Null(await disk.GetAsync("t"));
            Assert.Equal(TileSource.Memory, (await service.GetOrCreateAsync("t", () => [0])).Source);
            Assert.Equal([1, 2, 3], await disk.GetAsync("t"));
        }

        // A restart: memory is empty, the disk still holds the tile and fills memory again.
        using (var memory = new MemoryTileStore(new MemoryTileStoreOptions()))
        {
            var service = new TileCacheService(memory, await OpenDiskAsync(), shared);
            var lookup = await service.GetOrCreateAsync("t", () => throw new InvalidOperationException("must not render"));
            Assert.Equal(TileSource.Disk, lookup.Source);
            Assert.Equal([1, 2, 3], lookup.Bytes);
            Assert.True(memory.TryGet("t", out _));
            Assert.Equal(0, shared.Gets - 1); // the disk answered before the shared tier was asked (one get from the first render)
        }
    }

    [Fact]
    public async Task A_tile_asked_for_once_stays_off_the_disk_and_one_rendered_again_goes_on_it()
    {
        var disk = await OpenDiskAsync();
        var renders = 0;
        byte[] Render(byte value)
        {
            renders++;
            return [value];
        }

        // Tiles of a new display, each asked once: none is written.
        using (var memory = new MemoryTileStore(new MemoryTileStoreOptions()))
        {
            var service = new TileCacheService(memory, disk);
            for (byte i = 0; i < 50; i++) await service.GetOrCreateAsync($"once/{i}", () => Render(i));
            Assert.Equal(50, renders);
            Assert.Equal(0, disk.Count);
            Assert.Empty(Directory.EnumerateFiles(_folder.Path, "*.tile", SearchOption.AllDirectories));
        }

        // Memory lost the tile before its second ask (a memory tier that keeps nothing, as a full one evicting at
        // once): it is rendered again, and this time kept on disk.
        {
            var service = new TileCacheService(new KeepsNothing(), disk);
            await service.GetOrCreateAsync("again", () => Render(1));
            Assert.Null(await disk.GetAsync("again"));
            var second = await service.GetOrCreateAsync("again", () => Render(2));
            Assert.Equal(TileSource.Rendered, second.Source);
            Assert.Equal([2], await disk.GetAsync("again"));
            Assert.Equal(1, disk.Count);
            Assert.Equal(TileSource.Disk, (await service.GetOrCreateAsync("again", () => Render(3))).Source);
            Assert.Equal(52, renders);
        }
    }

    private sealed class KeepsNothing : ITileStore
    {
        public bool TryGet(string key, out byte[] bytes)
        {
            bytes = [];
            return false;
        }

        public void Set(string key, byte[] bytes)
        {
        }
    }

    [Fact]
    public async Task A_shared_hit_fills_the_disk_and_memory_tiers()
    {
        // Another instance rendered the tile: only the shared tier holds it.
        var shared = new InProcessSharedTier();
        await shared.SetAsync("s", [9, 8, 7], CancellationToken.None);
        var disk = await OpenDiskAsync();
        using var memory = new MemoryTileStore(new MemoryTileStoreOptions());
        var service = new TileCacheService(memory, disk, shared);

        var lookup = await service.GetOrCreateAsync("s", () => throw new InvalidOperationException("must not render"));
        Assert.Equal(TileSource.Shared, lookup.Source);
        Assert.Equal([9, 8, 7], await disk.GetAsync("s"));
        Assert.True(memory.TryGet("s", out var kept));
        Assert.Equal([9, 8, 7], kept);
    }

    [Fact]
    public async Task A_failed_render_is_not_kept_and_the_next_request_tries_again()
    {
        using var memory = new MemoryTileStore(new MemoryTileStoreOptions());
        var disk = await OpenDiskAsync();
        var service = new TileCacheService(memory, disk);
        await Assert.ThrowsAsync<InvalidOperationException>(async () => await service.GetOrCreateAsync("k", () => throw new InvalidOperationException("boom")));
        Assert.False(memory.TryGet("k", out _));
        Assert.Null(await disk.GetAsync("k"));
        var lookup = await service.GetOrCreateAsync("k", () => [7]);
        Assert.Equal(TileSource.Rendered, lookup.Source);
        Assert.Equal([7], lookup.Bytes);
    }

    [Fact]
    public async Task A_full_render_queue_refuses_new_renders_while_cache_hits_still_answer()
    {
        using var memory = new MemoryTileStore(new MemoryTileStoreOptions());
        var disk = await OpenDiskAsync();
        using var queue = new RenderQueue(new RenderQueueOptions { ConcurrentRenders = 1, WaitingRenders = 0 });
        var service = new TileCacheService(memory, disk, shared: null, queue);
        memory.Set("in memory", [1]);
        await disk.SetAsync("on disk", [2]);

        using var gate = new ManualResetEventSlim();
        var slow = service.GetOrCreateAsync("slow", () => { gate.Wait(TimeSpan.FromSeconds(20)); return [3]; }).AsTask();
        while (queue.Admitted < 1) await Task.Delay(5);

        var refused = await Assert.ThrowsAsync<RenderQueueFullException>(() => service.GetOrCreateAsync("new", () => [4]).AsTask());
        Assert.Equal(1, refused.RetryAfterSeconds);
        Assert.Equal(TileSource.Memory, (await service.GetOrCreateAsync("in memory", () => [0])).Source);
        Assert.Equal(TileSource.Disk, (await service.GetOrCreateAsync("on disk", () => [0])).Source);
        Assert.False(slow.IsCompleted);

        gate.Set();
        Assert.Equal([3], (await slow).Bytes);
        // The refusal was not kept: once the slot is free the tile renders.
        Assert.Equal(TileSource.Rendered, (await service.GetOrCreateAsync("new", () => [4])).Source);
    }

    [Fact]
    public async Task A_cancelled_request_stops_waiting_but_the_render_still_lands_in_the_cache()
    {
        using var memory = new MemoryTileStore(new MemoryTileStoreOptions());
        var service = new TileCacheService(memory);
        using var gate = new ManualResetEventSlim();
        using var cancel = new CancellationTokenSource();
        var request = service.GetOrCreateAsync("c", () => { gate.Wait(TimeSpan.FromSeconds(20)); return [5]; }, cancel.Token).AsTask();
        cancel.Cancel();
        await Assert.ThrowsAnyAsync<OperationCanceledException>(() => request);

        gate.Set();
        var deadline = DateTime.UtcNow.AddSeconds(20);
        while (!memory.TryGet("c", out _) && DateTime.UtcNow < deadline) await Task.Delay(10);
        Assert.Equal(TileSource.Memory, (await service.GetOrCreateAsync("c", () => [0])).Source);
    }
}
