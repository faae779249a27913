using System.Buffers;
using Mosaic.Imaging.Display;
using Mosaic.Imaging.Encoding;
using Mosaic.Imaging.Rendering;

namespace Mosaic.Imaging.Composite;

/// <summary>
/// Three bands of rows to one PNG: RGBA where something is masked and masked pixels are transparent (alpha 0), RGB
/// otherwise (masked pixels in the masked colour). A first pass looks for NaN in any band and stops at the first
/// band of rows holding one; the rows still in hand are not read again.
/// </summary>
internal static class CompositeComposer
{
    /// <param name="knownUnmasked">The caller knows no band holds a NaN (a pyramid's histogram counts none), so the first pass is skipped.</param>
    public static byte[] Render<TRows>(scoped ref TRows red, scoped ref TRows green, scoped ref TRows blue,
        int rowsPerBand, int width, int height, CompositeMap map, MaskedColor masked, bool knownUnmasked = false)
        where TRows : IValueRows, allows ref struct
    {
        ArgumentNullException.ThrowIfNull(map);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(width);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(height);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(rowsPerBand);

        ReadOnlySpan<float> r = default, g = default, b = default;
        var inHandFirst = -1;
        var anyMasked = false;
        for (var y0 = 0; y0 < height && !anyMasked && !knownUnmasked; y0 += rowsPerBand)
        {
            var count = Math.Min(rowsPerBand, height - y0);
            r = red.Read(y0, count);
            g = green.Read(y0, count);
            b = blue.Read(y0, count);
            inHandFirst = y0;
            anyMasked = NanCount.Of(r) > 0 || NanCount.Of(g) > 0 || NanCount.Of(b) > 0;
        }

        var colorType = anyMasked && masked.IsTransparent ? PngColorType.Rgba : PngColorType.Rgb;
        var levels = ArrayPool<byte>.Shared.Rent(3 * width);
        try
        {
            var lr = levels.AsSpan(0, width);
            var lg = levels.AsSpan(width, width);
            var lb = levels.AsSpan(2 * width, width);
            using var writer = new PngWriter(width, height, colorType, PngCompression.HuffmanOnly);
            for (var y0 = 0; y0 < height; y0 += rowsPerBand)
            {
                if (y0 != inHandFirst)
                {
                    var count = Math.Min(rowsPerBand, height - y0);
                    r = red.Read(y0, count);
                    g = green.Read(y0, count);
                    b = blue.Read(y0, count);
                    inHandFirst = y0;
                }
                for (var offset = 0; offset < r.Length; offset += width)
                {
                    var rowR = r.Slice(offset, width);
                    var rowG = g.Slice(offset, width);
                    var rowB = b.Slice(offset, width);
                    map.Apply(rowR, rowG, rowB, lr, lg, lb);
                    if (colorType == PngColorType.Rgba) ChannelInterleave.Rgba(lr, lg, lb, rowR, rowG, rowB, writer.NextRow());
                    else if (anyMasked) ChannelInterleave.Rgb(lr, lg, lb, rowR, rowG, rowB, writer.NextRow(), masked.Color);
                    else ChannelInterleave.Rgb(lr, lg, lb, writer.NextRow());
                }
            }
            return writer.Finish();
        }
        finally
        {
            ArrayPool<byte>.Shared.Return(levels);
        }
    }
}
