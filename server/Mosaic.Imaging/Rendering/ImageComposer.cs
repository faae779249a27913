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
        var rows = new SpanRows(valuesTopDown, width);
        return Render(ref rows, height, width, height, map, masked);
    }

    /// <summary>
    /// The one implementation: rows come a band of <paramref name="rowsPerBand"/> at a time. The colour type must be
    /// known before the first row is written, so a first pass looks for a masked value wherever that matters and
    /// stops at the first band holding one; the band still in hand is not read again.
    /// </summary>
    public static byte[] Render<TRows>(scoped ref TRows rows, int rowsPerBand, int width, int height, ToneMap map, MaskedColor masked)
        where TRows : IValueRows, allows ref struct
    {
        ArgumentNullException.ThrowIfNull(map);
        if (width <= 0) throw new ArgumentOutOfRangeException(nameof(width), width, "width must be > 0");
        if (height <= 0) throw new ArgumentOutOfRangeException(nameof(height), height, "height must be > 0");
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(rowsPerBand);

        ReadOnlySpan<float> inHand = default;
        var inHandFirst = -1;
        var anyMasked = false;
        // A colour palette with an opaque masked colour is indexed either way: no need to look.
        if (map.IsGray || masked.IsTransparent)
            for (var y0 = 0; y0 < height && !anyMasked; y0 += rowsPerBand)
            {
                inHand = rows.Read(y0, Math.Min(rowsPerBand, height - y0));
                inHandFirst = y0;
                anyMasked = NanCount.Of(inHand) > 0;
            }

        var colorType = !map.IsGray ? PngColorType.Indexed
            : !anyMasked ? PngColorType.Gray
            : masked.IsTransparent ? PngColorType.GrayAlpha : PngColorType.Rgb;
        byte[]? entries = colorType == PngColorType.Indexed ? map.WithMasked(masked).PaletteBytes! : null;
        ReadOnlySpan<byte> transparency = colorType == PngColorType.Indexed && masked.IsTransparent && anyMasked ? [0] : [];
        var expands = colorType is PngColorType.GrayAlpha or PngColorType.Rgb;
        var levels = expands ? ArrayPool<byte>.Shared.Rent(width) : null;
        try
        {
            using var writer = new PngWriter(width, height, colorType, PngCompression.HuffmanOnly, entries, transparency);
            var (r, g, b) = (masked.Color.R, masked.Color.G, masked.Color.B);
            for (var y0 = 0; y0 < height; y0 += rowsPerBand)
            {
                if (y0 != inHandFirst)
                {
                    inHand = rows.Read(y0, Math.Min(rowsPerBand, height - y0));
                    inHandFirst = y0;
                }
                for (var offset = 0; offset < inHand.Length; offset += width)
                {
                    var row = inHand.Slice(offset, width);
                    if (!expands)
                    {
                        map.Apply(row, writer.NextRow());
                        continue;
                    }
                    var rowLevels = levels.AsSpan(0, width);
                    map.Apply(row, rowLevels);
                    if (colorType == PngColorType.GrayAlpha) GrayAlpha.Interleave(rowLevels, row, writer.NextRow());
                    else GrayRgb.Expand(rowLevels, row, writer.NextRow(), r, g, b);
                }
            }
            return writer.Finish();
        }
        finally
        {
            if (levels is not null) ArrayPool<byte>.Shared.Return(levels);
        }
    }
}
