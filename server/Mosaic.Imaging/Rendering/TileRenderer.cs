using Mosaic.Imaging.Pyramids;

namespace Mosaic.Imaging.Rendering;

/// <summary>CONTRACT STUB: one PNG tile from a pyramid and a compiled display.</summary>
public static class TileRenderer
{
    /// <summary>8-bit grayscale PNG; grayscale + alpha where the tile has masked or outside pixels, which are transparent.</summary>
    public static byte[] RenderPng(Pyramid pyramid, int z, int x, int y, ToneMap toneMap) => throw new NotImplementedException();
}
