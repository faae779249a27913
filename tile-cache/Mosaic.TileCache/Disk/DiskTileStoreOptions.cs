namespace Mosaic.TileCache.Disk;

public sealed class DiskTileStoreOptions
{
    /// <summary>The smallest bound accepted: below it the folder would hold a handful of tiles.</summary>
    public const long MinimumCapacityBytes = 1L << 20;

    /// <summary>The folder of tile files; created when missing. Only files this store names are touched in it.</summary>
    public required string Directory { get; init; }

    /// <summary>Bound on the bytes of tile files; the least recently used go first past it.</summary>
    public long CapacityBytes { get; init; } = 2L << 30;
}
