namespace Mosaic.TileCache;

public sealed class MemoryTileStoreOptions
{
    /// <summary>Bound on the bytes of tiles held; the oldest-used go first past it.</summary>
    public long CapacityBytes { get; set; } = 128L * 1024 * 1024;
}
