using System.Collections.Concurrent;

namespace Mosaic.TileCache.Tests;

/// <summary>A working shared tier held in this process (what a second instance would see through the shared backend), counting its calls.</summary>
internal sealed class InProcessSharedTier : ISharedTileTier
{
    private readonly ConcurrentDictionary<string, byte[]> _tiles = new(StringComparer.Ordinal);
    private int _gets;

    public int Gets => Volatile.Read(ref _gets);

    public bool Holds(string key) => _tiles.ContainsKey(key);

    public ValueTask<byte[]?> GetAsync(string key, CancellationToken cancellationToken)
    {
        Interlocked.Increment(ref _gets);
        return ValueTask.FromResult(_tiles.TryGetValue(key, out var bytes) ? bytes : null);
    }

    public ValueTask SetAsync(string key, byte[] bytes, CancellationToken cancellationToken)
    {
        _tiles[key] = bytes;
        return ValueTask.CompletedTask;
    }
}
