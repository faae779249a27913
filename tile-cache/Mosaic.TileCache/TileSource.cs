namespace Mosaic.TileCache;

/// <summary>Where a tile's bytes came from, nearest tier first.</summary>
public enum TileSource
{
    Memory,
    Disk,
    Shared,
    Rendered,
}
