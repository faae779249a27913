using Microsoft.Extensions.Caching.Memory;

namespace Mosaic.TileCache;

/// <summary>The in-memory tier, bounded in bytes (each entry's size is its length plus a fixed overhead).</summary>
public sealed class MemoryTileStore : ITileStore, IDisposable
{
    // Keys, the entry object and the dictionary slot cost roughly this much beside the bytes.
    private const int EntryOverheadBytes = 256;
    private readonly MemoryCache _cache;

    public MemoryTileStore(MemoryTileStoreOptions options)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(options.CapacityBytes, 1L << 20, nameof(options.CapacityBytes));
        _cache = new MemoryCache(new MemoryCacheOptions
        {
            SizeLimit = options.CapacityBytes,
            CompactionPercentage = 0.1,
        });
    }

    public long CurrentBytes => _cache.GetCurrentStatistics()?.CurrentEstimatedSize ?? 0;

    public bool TryGet(string key, out byte[] bytes)
    {
        if (_cache.TryGetValue(key, out var value) && value is byte[] b)
        {
            bytes = b;
            return true;
        }
        bytes = [];
        return false;
    }

    public void Set(string key, byte[] bytes)
    {
        using var entry = _cache.CreateEntry(key);
        entry.Value = bytes;
        entry.Size = bytes.Length + EntryOverheadBytes;
    }

    public void Dispose() => _cache.Dispose();
}
