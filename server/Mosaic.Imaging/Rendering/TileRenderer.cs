using System.Buffers;
using Mosaic.Imaging.Pyramids;

namespace Mosaic.Imaging.Rendering;

/// <summary>One PNG tile from a pyramid and a compiled display.</summary>
public static class TileRenderer
{
    public const int TilePixels = PyramidGeometry.TileSize * PyramidGeometry.TileSize;

    /// <summary>
    /// 8-bit grayscale PNG for gray palettes (gray + alpha where the tile has masked or outside pixels and they are
    /// transparent, RGB where they get a colour); indexed PNG for colour palettes. Masked as in the tone map.
    /// </summary>
    public static byte[] RenderPng(Pyramid pyramid, int z, int x, int y, ToneMap toneMap)
    {
        ArgumentNullException.ThrowIfNull(pyramid);
        ArgumentNullException.ThrowIfNull(toneMap);
        if (!pyramid.Geometry.Contains(z, x, y))
            throw new ArgumentOutOfRangeException(nameof(z), $"tile z={z} x={x} y={y} is outside the pyramid (max zoom {pyramid.Geometry.MaxZoom})");
        var values = ArrayPool<float>.Shared.Rent(TilePixels);
        try
        {
            var tile = values.AsSpan(0, TilePixels);
            pyramid.ReadTile(z, x, y, tile);
            return RenderPng(tile, toneMap);
        }
        finally
        {
            ArrayPool<float>.Shared.Return(values);
        }
    }

    /// <summary>The same from a tile already read: 256 x 256 values, row 0 at the top, NaN where masked or outside.</summary>
    public static byte[] RenderPng(ReadOnlySpan<float> tile, ToneMap toneMap)
    {
        ArgumentNullException.ThrowIfNull(toneMap);
        if (tile.Length != TilePixels)
            throw new ArgumentException($"a tile holds {TilePixels} values ({PyramidGeometry.TileSize} x {PyramidGeometry.TileSize}), not {tile.Length}", nameof(tile));
        return ImageComposer.Render(tile, PyramidGeometry.TileSize, PyramidGeometry.TileSize, toneMap, toneMap.Masked);
    }
}
