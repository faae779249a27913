namespace Mosaic.TileCache;

/// <summary>Looks a tile up in the store, else computes it once however many ask at the same moment, then keeps it.</summary>
public sealed class TileCacheService(ITileStore store)
{
    private readonly SingleFlight _singleFlight = new();

    public async ValueTask<(byte[] Bytes, bool Hit)> GetOrCreateAsync(string key, Func<byte[]> render)
    {
        if (store.TryGet(key, out var cached)) return (cached, true);
        var bytes = await _singleFlight.RunAsync(key, () => Task.Run(() =>
        {
            if (store.TryGet(key, out var raced)) return raced;
            var rendered = render();
            store.Set(key, rendered);
            return rendered;
        })).ConfigureAwait(false);
        return (bytes, false);
    }
}
