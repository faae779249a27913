using System.Collections.Concurrent;

namespace Mosaic.TileCache;

/// <summary>Concurrent requests for the same missing key share one computation instead of each doing it.</summary>
public sealed class SingleFlight
{
    private readonly ConcurrentDictionary<string, Lazy<Task<byte[]>>> _inFlight = new(StringComparer.Ordinal);

    public async Task<byte[]> RunAsync(string key, Func<Task<byte[]>> compute)
    {
        var lazy = _inFlight.GetOrAdd(key, _ => new Lazy<Task<byte[]>>(compute, LazyThreadSafetyMode.ExecutionAndPublication));
        try
        {
            return await lazy.Value.ConfigureAwait(false);
        }
        finally
        {
            _inFlight.TryRemove(new KeyValuePair<string, Lazy<Task<byte[]>>>(key, lazy));
        }
    }
}
