namespace Mosaic.TileCache;

/// <summary>
/// A tile tier shared by several server instances (Redis). Slower than memory and sometimes unreachable: an
/// implementation never throws for an unreachable backend, it answers null (a miss) and drops writes.
/// </summary>
public interface ISharedTileTier
{
    ValueTask<byte[]?> GetAsync(string key, CancellationToken cancellationToken);

    ValueTask SetAsync(string key, byte[] bytes, CancellationToken cancellationToken);
}
