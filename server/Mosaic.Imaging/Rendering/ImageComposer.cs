using System.Buffers;
using Mosaic.Imaging.Display;
using Mosaic.Imaging.Encoding;

namespace Mosaic.Imaging.Rendering;

/// <summary>
/// Values to PNG, row by row into the encoder's own buffer. The colour type follows the palette and the mask:
/// gray palette → 8-bit gray (gray + alpha where masked pixels are transparent, RGB where they get a colour);
/// colour palette → indexed (index 0 the masked colour, tRNS making it transparent where asked). 1 byte a pixel
/// wherever there is nothing masked or the palette is a colour one.
/// </summary>
internal static class ImageComposer
{
    public static byte[] Render(ReadOnlySpan<float> valuesTopDown, int width, int height, ToneMap map, MaskedColor masked)
    {
        ArgumentNullException.ThrowIfNull(map);
        if (width <= 0) throw new ArgumentOutOfRangeException(nameof(width), width, "width must be > 0");
        if (height <= 0) throw new ArgumentOutOfRangeException(nameof(height), height, "height must be > 0");
        if (valuesTopDown.Length != (long)width * height)
            throw new ArgumentException($"{valuesTopDown.Length} values cannot fill {width} x {height} pixels", nameof(valuesTopDown));
        var anyMasked = NanCount.Of(valuesTopDown) > 0;

        if (!map.IsGray)
        {
            var entries = map.WithMasked(masked).PaletteBytes!;
            ReadOnlySpan<byte> transparency = masked.IsTransparent && anyMasked ? [0] : [];
            using var writer = new PngWriter(width, height, PngColorType.Indexed, PngCompression.HuffmanOnly, entries, transparency);
            for (var y = 0; y < height; y++) map.Apply(valuesTopDown.Slice(y * width, width), writer.NextRow());
            return writer.Finish();
        }
        if (!anyMasked)
        {
            using var writer = new PngWriter(width, height, PngColorType.Gray);
            for (var y = 0; y < height; y++) map.Apply(valuesTopDown.Slice(y * width, width), writer.NextRow());
            return writer.Finish();
        }
        var levels = ArrayPool<byte>.Shared.Rent(width);
        try
        {
            using var writer = new PngWriter(width, height, masked.IsTransparent ? PngColorType.GrayAlpha : PngColorType.Rgb);
            var (r, g, b) = (masked.Color.R, masked.Color.G, masked.Color.B);
            for (var y = 0; y < height; y++)
            {
                var row = valuesTopDown.Slice(y * width, width);
                var rowLevels = levels.AsSpan(0, width);
                map.Apply(row, rowLevels);
                if (masked.IsTransparent) GrayAlpha.Interleave(rowLevels, row, writer.NextRow());
                else GrayRgb.Expand(rowLevels, row, writer.NextRow(), r, g, b);
            }
            return writer.Finish();
        }
        finally
        {
            ArrayPool<byte>.Shared.Return(levels);
        }
    }
}
