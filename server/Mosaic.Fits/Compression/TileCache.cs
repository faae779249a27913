namespace Mosaic.Fits.Compression;

/// <summary>The most recently used decoded tiles, bounded in bytes; thread-safe.</summary>
internal sealed class TileCache(long capacityBytes)
{
    private readonly Dictionary<int, LinkedListNode<(int Key, DecodedTile Tile)>> _byKey = [];
    private readonly LinkedList<(int Key, DecodedTile Tile)> _recent = new();
    private readonly Lock _lock = new();
    private long _bytes;

    public long CapacityBytes { get; } = capacityBytes;

    public bool TryGet(int key, out DecodedTile tile)
    {
        lock (_lock)
        {
            if (_byKey.TryGetValue(key, out var node))
            {
                _recent.Remove(node);
                _recent.AddFirst(node);
                tile = node.Value.Tile;
                return true;
            }
        }
        tile = null!;
        return false;
    }

    public void Add(int key, DecodedTile tile)
    {
        lock (_lock)
        {
            if (_byKey.ContainsKey(key)) return;
            _byKey[key] = _recent.AddFirst((key, tile));
            _bytes += tile.Samples.Length;
            while (_bytes > CapacityBytes && _recent.Count > 1)
            {
                var oldest = _recent.Last!;
                _recent.RemoveLast();
                _byKey.Remove(oldest.Value.Key);
                _bytes -= oldest.Value.Tile.Samples.Length;
            }
        }
    }

    /// <summary>Tiles held now (for tests of the bound).</summary>
    public int Count
    {
        get { lock (_lock) return _byKey.Count; }
    }
}
