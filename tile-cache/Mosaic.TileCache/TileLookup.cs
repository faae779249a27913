namespace Mosaic.TileCache;

/// <summary>A tile's encoded bytes and the tier that answered.</summary>
public readonly record struct TileLookup(byte[] Bytes, TileSource Source)
{
    /// <summary>True when some tier had the tile and nothing was rendered for this request.</summary>
    public bool Hit => Source != TileSource.Rendered;
}
