using System.Collections.Concurrent;

namespace Mosaic.TileCache;

/// <summary>Concurrent requests for the same missing key share one computation instead of each doing it.</summary>
public sealed class SingleFlight<T>
{
    private readonly ConcurrentDictionary<string, Lazy<Task<T>>> _inFlight = new(StringComparer.Ordinal);

    /// <summary>The running computation for the key, or a new one. A failed computation is not kept: the next call starts again.</summary>
    public Task<T> RunAsync(string key, Func<Task<T>> compute)
    {
        ArgumentNullException.ThrowIfNull(compute);
        if (_inFlight.TryGetValue(key, out var running)) return running.Value;
        // Assigned before it is published in the dictionary, so whichever thread runs it sees itself.
        Lazy<Task<T>>? mine = null;
        mine = new Lazy<Task<T>>(() => RunThenForgetAsync(key, compute, mine!), LazyThreadSafetyMode.ExecutionAndPublication);
        return _inFlight.GetOrAdd(key, mine).Value;
    }

    public int Count => _inFlight.Count;

    private async Task<T> RunThenForgetAsync(string key, Func<Task<T>> compute, Lazy<Task<T>> self)
    {
        try
        {
            return await compute().ConfigureAwait(false);
        }
        finally
        {
            _inFlight.TryRemove(new KeyValuePair<string, Lazy<Task<T>>>(key, self));
        }
    }
}
