using System.Buffers;
using Mosaic.Imaging.Display;

namespace Mosaic.Imaging.Rendering;

/// <summary>A PNG of any box of pixel values at native resolution (render.png), streamed row by row into the encoder.</summary>
public static class RegionRenderer
{
    /// <summary>Largest image rendered: 50 megapixels.</summary>
    public const long MaxPixels = 50_000_000;

    /// <summary>
    /// Most floats a <see cref="RowBandReader"/> is asked for at once (4 MiB), unless one row is wider: a band is
    /// always whole rows, at least one.
    /// </summary>
    public const int BandFloats = 1 << 20;

    /// <summary>
    /// valuesTopDown: width x height values, the top row first, NaN where masked. Gray palette → 8-bit grayscale
    /// (gray + alpha if <paramref name="masked"/> is transparent and some pixel is masked, RGB if it is a colour);
    /// other palettes → indexed with the masked colour at index 0.
    /// </summary>
    public static byte[] RenderPng(ReadOnlySpan<float> valuesTopDown, int width, int height, ToneMap map, MaskedColor masked)
    {
        Validate(width, height, map);
        return ImageComposer.Render(valuesTopDown, width, height, map, masked);
    }

    /// <summary>
    /// The same PNG, byte for byte, with the values read on demand in bands of at most <see cref="BandFloats"/>
    /// floats (or one row), so only one band is held besides the encoder's output. Where the colour type depends
    /// on whether anything is masked, rows are read twice: once to look for NaN, once to encode.
    /// </summary>
    public static byte[] RenderPng(RowBandReader readRows, int width, int height, ToneMap map, MaskedColor masked)
    {
        ArgumentNullException.ThrowIfNull(readRows);
        Validate(width, height, map);
        var rowsPerBand = Math.Clamp(BandFloats / width, 1, height);
        var band = ArrayPool<float>.Shared.Rent(rowsPerBand * width);
        try
        {
            var rows = new ReaderRows(readRows, band, width);
            return ImageComposer.Render(ref rows, rowsPerBand, width, height, map, masked);
        }
        finally
        {
            ArrayPool<float>.Shared.Return(band);
        }
    }

    private static void Validate(int width, int height, ToneMap map)
    {
        ArgumentNullException.ThrowIfNull(map);
        if (width <= 0) throw new ArgumentOutOfRangeException(nameof(width), width, "width must be > 0");
        if (height <= 0) throw new ArgumentOutOfRangeException(nameof(height), height, "height must be > 0");
        if ((long)width * height > MaxPixels)
            throw new ArgumentOutOfRangeException(nameof(width), $"{width} x {height} pixels exceed the {MaxPixels / 1_000_000} megapixel limit");
    }
}
