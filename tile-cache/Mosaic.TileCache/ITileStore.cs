namespace Mosaic.TileCache;

/// <summary>Encoded tiles by key. Knows bytes and keys only: what a key means is the caller's business.</summary>
public interface ITileStore
{
    bool TryGet(string key, out byte[] bytes);

    void Set(string key, byte[] bytes);
}
