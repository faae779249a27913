namespace Mosaic.TileCache.Disk;

/// <summary>
/// The tile files known to be on disk with their sizes, most recently used first. One lock: it is taken only on
/// memory misses, which already cost a file read.
/// </summary>
internal sealed class DiskTileIndex
{
    private readonly Dictionary<string, LinkedListNode<Entry>> _byName = new(StringComparer.Ordinal);
    private readonly LinkedList<Entry> _byUse = new();
    private readonly Lock _lock = new();
    private long _bytes;

    public long Bytes
    {
        get { lock (_lock) return _bytes; }
    }

    public int Count
    {
        get { lock (_lock) return _byName.Count; }
    }

    /// <summary>Marks the file as the most recently used, adding it or updating its size.</summary>
    public void Touch(string name, long bytes)
    {
        lock (_lock)
        {
            if (_byName.TryGetValue(name, out var node))
            {
                _bytes += bytes - node.Value.Bytes;
                node.Value.Bytes = bytes;
                _byUse.Remove(node);
                _byUse.AddFirst(node);
                return;
            }
            _byName[name] = _byUse.AddFirst(new Entry(name, bytes));
            _bytes += bytes;
        }
    }

    /// <summary>Adds files found on disk behind every file used since start, in the order given (most recent first); known names are left where they are.</summary>
    public void AddOlder(IEnumerable<(string Name, long Bytes)> mostRecentFirst)
    {
        lock (_lock)
        {
            foreach (var (name, bytes) in mostRecentFirst)
            {
                if (_byName.ContainsKey(name)) continue;
                _byName[name] = _byUse.AddLast(new Entry(name, bytes));
                _bytes += bytes;
            }
        }
    }

    public void Remove(string name)
    {
        lock (_lock)
        {
            if (!_byName.Remove(name, out var node)) return;
            _byUse.Remove(node);
            _bytes -= node.Value.Bytes;
        }
    }

    /// <summary>Drops the least recently used files until the rest fit in <paramref name="capacity"/>; gives their names for deletion.</summary>
    public List<string> TakeOverflow(long capacity)
    {
        var taken = new List<string>();
        lock (_lock)
        {
            if (_bytes <= capacity) return taken;
            while (_bytes > capacity && _byUse.Last is { } oldest)
            {
                _byUse.RemoveLast();
                _byName.Remove(oldest.Value.Name);
                _bytes -= oldest.Value.Bytes;
                taken.Add(oldest.Value.Name);
            }
        }
        return taken;
    }

    /// <summary>Names from least to most recently used.</summary>
    public List<string> OldestFirst()
    {
        lock (_lock)
        {
            var names = new List<string>(_byName.Count);
            for (var node = _byUse.Last; node is not null; node = node.Previous) names.Add(node.Value.Name);
            return names;
        }
    }

    private sealed class Entry(string name, long bytes)
    {
        public string Name { get; } = name;

        public long Bytes { get; set; } = bytes;
    }
}
