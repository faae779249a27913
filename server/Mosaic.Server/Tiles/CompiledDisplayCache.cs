namespace Mosaic.Server.Tiles;

/// <summary>
/// Compiled displays kept by key within a bound in bytes, least recently used dropped first. A key is compiled
/// once however many ask at the same moment (a screen of tiles after one change of settings asks 16 times at
/// once); a compile that fails is not kept, so a band still being prepared is compiled again when asked again.
/// </summary>
public sealed class CompiledDisplayCache<T> where T : class
{
    // Dictionary entry, list node and slot objects, plus the key's own string: counted so many small entries are bounded too.
    private const long EntryOverheadBytes = 160;

    private readonly Func<T, long> _sizeOf;
    private readonly object _gate = new();
    private readonly Dictionary<string, LinkedListNode<Entry>> _entries = new(StringComparer.Ordinal);
    // Most recently used first.
    private readonly LinkedList<Entry> _order = new();
    private long _bytes;

    /// <param name="capacityBytes">Bound on the bytes the kept displays hold (at least one display is always kept).</param>
    /// <param name="sizeOf">The bytes a compiled display holds.</param>
    public CompiledDisplayCache(long capacityBytes, Func<T, long> sizeOf)
    {
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(capacityBytes);
        CapacityBytes = capacityBytes;
        _sizeOf = sizeOf ?? throw new ArgumentNullException(nameof(sizeOf));
    }

    public long CapacityBytes { get; }

    /// <summary>Bytes held by the displays kept now, their keys included.</summary>
    public long CurrentBytes
    {
        get { lock (_gate) return _bytes; }
    }

    public int Count
    {
        get { lock (_gate) return _entries.Count; }
    }

    /// <summary>The display kept for the key, else compiled by <paramref name="compile"/> (once for concurrent callers) and kept.</summary>
    public T GetOrCompile(string key, Func<T> compile)
    {
        ArgumentNullException.ThrowIfNull(key);
        ArgumentNullException.ThrowIfNull(compile);
        LinkedListNode<Entry> node;
        lock (_gate)
        {
            if (_entries.TryGetValue(key, out var found))
            {
                if (found.Value.Compiled is { } ready)
                {
                    MoveToFront(found);
                    return ready;
                }
                node = found;
            }
            else
            {
                node = _order.AddFirst(new Entry(key, new Lazy<T>(compile, LazyThreadSafetyMode.ExecutionAndPublication)));
                _entries.Add(key, node);
            }
        }

        T value;
        try
        {
            value = node.Value.Pending.Value;
        }
        catch
        {
            lock (_gate) Forget(node);
            throw;
        }

        // Sized outside the lock; the first caller to come back accounts for it and applies the bound.
        var bytes = _sizeOf(value) + EntryOverheadBytes + 2L * key.Length;
        lock (_gate)
        {
            if (node.Value.Compiled is null && node.List is not null)
            {
                node.Value.Compiled = value;
                node.Value.Bytes = bytes;
                _bytes += bytes;
                MoveToFront(node);
                while (_bytes > CapacityBytes && _order.Last is { } oldest && oldest != node) Forget(oldest);
            }
        }
        return value;
    }

    private void MoveToFront(LinkedListNode<Entry> node)
    {
        if (node == _order.First) return;
        _order.Remove(node);
        _order.AddFirst(node);
    }

    private void Forget(LinkedListNode<Entry> node)
    {
        if (node.List is null) return;
        _order.Remove(node);
        _entries.Remove(node.Value.Key);
        _bytes -= node.Value.Bytes;
    }

    private sealed class Entry(string key, Lazy<T> pending)
    {
        public string Key { get; } = key;

        public Lazy<T> Pending { get; } = pending;

        public T? Compiled { get; set; }

        public long Bytes { get; set; }
    }
}
