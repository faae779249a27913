using Mosaic.Imaging.Display;
using Mosaic.Imaging.Display.Palettes;

namespace Mosaic.Imaging.Rendering;

/// <summary>The PLTE of an indexed tile: index 0 the masked colour, index k = 1..255 the palette at t = (k - 1) / 254.</summary>
internal static class PaletteEntries
{
    public const int Count = 256;

    public static byte[] For(IPalette palette, MaskedColor masked)
    {
        var bytes = new byte[3 * Count];
        if (!masked.IsTransparent) (bytes[0], bytes[1], bytes[2]) = (masked.Color.R, masked.Color.G, masked.Color.B);
        for (var k = 1; k < Count; k++)
        {
            var c = palette.Color((k - 1) / 254.0);
            (bytes[3 * k], bytes[3 * k + 1], bytes[3 * k + 2]) = (c.R, c.G, c.B);
        }
        return bytes;
    }

}
