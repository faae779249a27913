namespace Mosaic.Imaging.Pyramids;

/// <summary>
/// The tile grid of an image of Width x Height native pixels. Zoom 0 holds the whole image in one tile; MaxZoom is
/// one native pixel per tile pixel. Levels and tiles are anchored at the top-left corner: tile x grows to the right,
/// tile y downward from the top, and the top row is the highest FITS y. Level z has a pixel for each
/// Factor(z) x Factor(z) block of native pixels.
/// </summary>
public sealed record PyramidGeometry(int Width, int Height)
{
    public const int TileSize = 256;

    public int MaxZoom { get; } = ComputeMaxZoom(Width, Height);

    /// <summary>Native pixels per level pixel along each axis at zoom z.</summary>
    public int Factor(int z) => 1 << (MaxZoom - z);

    public int LevelWidth(int z) => (int)(((long)Width + Factor(z) - 1) / Factor(z));

    public int LevelHeight(int z) => (int)(((long)Height + Factor(z) - 1) / Factor(z));

    public int TilesX(int z) => (LevelWidth(z) + TileSize - 1) / TileSize;

    public int TilesY(int z) => (LevelHeight(z) + TileSize - 1) / TileSize;

    public bool Contains(int z, int x, int y) => z >= 0 && z <= MaxZoom && x >= 0 && y >= 0 && x < TilesX(z) && y < TilesY(z);

    private static int ComputeMaxZoom(int width, int height)
    {
        if (width <= 0 || height <= 0) throw new ArgumentOutOfRangeException(nameof(width), "an image needs at least one pixel");
        var z = 0;
        while ((long)TileSize << z < Math.Max(width, height)) z++;
        return z;
    }
}
