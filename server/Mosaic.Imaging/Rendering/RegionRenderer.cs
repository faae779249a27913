using Mosaic.Imaging.Display;

namespace Mosaic.Imaging.Rendering;

/// <summary>A PNG of any box of pixel values at native resolution (render.png), streamed row by row into the encoder.</summary>
public static class RegionRenderer
{
    /// <summary>Largest image rendered: 50 megapixels.</summary>
    public const long MaxPixels = 50_000_000;

    /// <summary>
    /// valuesTopDown: width x height values, the top row first, NaN where masked. Gray palette → 8-bit grayscale
    /// (gray + alpha if <paramref name="masked"/> is transparent and some pixel is masked, RGB if it is a colour);
    /// other palettes → indexed with the masked colour at index 0.
    /// </summary>
    public static byte[] RenderPng(ReadOnlySpan<float> valuesTopDown, int width, int height, ToneMap map, MaskedColor masked)
    {
        ArgumentNullException.ThrowIfNull(map);
        if (width <= 0) throw new ArgumentOutOfRangeException(nameof(width), width, "width must be > 0");
        if (height <= 0) throw new ArgumentOutOfRangeException(nameof(height), height, "height must be > 0");
        if ((long)width * height > MaxPixels)
            throw new ArgumentOutOfRangeException(nameof(width), $"{width} x {height} pixels exceed the {MaxPixels / 1_000_000} megapixel limit");
        return ImageComposer.Render(valuesTopDown, width, height, map, masked);
    }
}
