namespace Mosaic.Imaging.Encoding;

/// <summary>Whole-image PNG encoding over <see cref="PngWriter"/>: 8-bit gray, gray + alpha, RGB or indexed.</summary>
public static class PngEncoder
{
    public static byte[] EncodeGray(ReadOnlySpan<byte> pixels, int width, int height)
        => Encode(pixels, width, height, PngColorType.Gray, PngCompression.HuffmanOnly, [], []);

    public static byte[] EncodeGray(ReadOnlySpan<byte> pixels, int width, int height, PngCompression compression)
        => Encode(pixels, width, height, PngColorType.Gray, compression, [], []);

    /// <summary>pixels interleaved as gray, alpha.</summary>
    public static byte[] EncodeGrayAlpha(ReadOnlySpan<byte> pixels, int width, int height)
        => Encode(pixels, width, height, PngColorType.GrayAlpha, PngCompression.HuffmanOnly, [], []);

    /// <summary>pixels interleaved as gray, alpha.</summary>
    public static byte[] EncodeGrayAlpha(ReadOnlySpan<byte> pixels, int width, int height, PngCompression compression)
        => Encode(pixels, width, height, PngColorType.GrayAlpha, compression, [], []);

    /// <summary>pixels interleaved as r, g, b.</summary>
    public static byte[] EncodeRgb(ReadOnlySpan<byte> pixels, int width, int height, PngCompression compression = PngCompression.HuffmanOnly)
        => Encode(pixels, width, height, PngColorType.Rgb, compression, [], []);

    /// <summary>One palette index a pixel; palette as r, g, b triples; transparency the alpha of the first entries (may be empty).</summary>
    public static byte[] EncodeIndexed(ReadOnlySpan<byte> pixels, int width, int height, ReadOnlySpan<byte> palette, ReadOnlySpan<byte> transparency,
        PngCompression compression = PngCompression.HuffmanOnly)
        => Encode(pixels, width, height, PngColorType.Indexed, compression, palette, transparency);

    private static byte[] Encode(ReadOnlySpan<byte> pixels, int width, int height, PngColorType colorType, PngCompression compression,
        ReadOnlySpan<byte> palette, ReadOnlySpan<byte> transparency)
    {
        if (width <= 0) throw new ArgumentOutOfRangeException(nameof(width), width, "width must be > 0");
        if (height <= 0) throw new ArgumentOutOfRangeException(nameof(height), height, "height must be > 0");
        var channels = colorType switch { PngColorType.GrayAlpha => 2, PngColorType.Rgb => 3, _ => 1 };
        var expected = (long)width * channels * height;
        if (pixels.Length != expected)
            throw new ArgumentException($"pixels holds {pixels.Length} bytes but a {width} x {height} image of {channels} byte(s) a pixel needs {expected}", nameof(pixels));
        using var writer = new PngWriter(width, height, colorType, compression, palette, transparency);
        var stride = writer.RowBytes;
        for (var y = 0; y < height; y++) pixels.Slice(y * stride, stride).CopyTo(writer.NextRow());
        return writer.Finish();
    }
}
