using Mosaic.TileCache;

namespace Mosaic.TileCache.Tests;

public sealed class MemoryTileStoreTests
{
    [Fact]
    public void Keeps_tiles_by_key()
    {
        using var store = new MemoryTileStore(new MemoryTileStoreOptions { CapacityBytes = 4 << 20 });
        store.Set("a/0/0/0", [1, 2, 3]);
        Assert.True(store.TryGet("a/0/0/0", out var bytes));
        Assert.Equal([1, 2, 3], bytes);
        Assert.False(store.TryGet("a/0/0/1", out _));
    }

    [Fact]
    public async Task Stays_within_its_byte_bound()
    {
        const long capacity = 2 << 20;
        using var store = new MemoryTileStore(new MemoryTileStoreOptions { CapacityBytes = capacity });
        for (var i = 0; i < 200; i++)
        {
            store.Set($"tile/{i}", new byte[50_000]);
            Assert.True(store.CurrentBytes <= capacity, $"{store.CurrentBytes} bytes held after {i + 1} tiles");
        }
        // Compaction runs in the background once the limit is hit; afterwards new tiles fit again. How soon depends
        // on the thread pool, so wait for it (bounded) rather than for a fixed time.
        var fitted = false;
        for (var attempt = 0; attempt < 200 && !fitted; attempt++)
        {
            store.Set("tile/late", new byte[50_000]);
            fitted = store.TryGet("tile/late", out _);
            if (!fitted) await Task.Delay(50);
        }
        Assert.True(fitted, "a new tile never fitted after compaction");
        Assert.True(store.CurrentBytes <= capacity, $"{store.CurrentBytes} bytes held after compaction");
        var held = Enumerable.Range(0, 200).Count(i => store.TryGet($"tile/{i}", out _));
        Assert.InRange(held, 1, (int)(capacity / 50_000));
    }

    [Fact]
    public void Rejects_a_capacity_too_small_to_hold_a_tile()
    {
        var error = Assert.Throws<ArgumentOutOfRangeException>(() => new MemoryTileStore(new MemoryTileStoreOptions { CapacityBytes = 1000 }));
        Assert.Contains("CapacityBytes", error.Message);
    }
}
