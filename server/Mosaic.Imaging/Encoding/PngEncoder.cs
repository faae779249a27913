namespace Mosaic.Imaging.Encoding;

/// <summary>CONTRACT STUB: minimal, fast PNG writer for tiles (8-bit gray, gray + alpha).</summary>
public static class PngEncoder
{
    public static byte[] EncodeGray(ReadOnlySpan<byte> pixels, int width, int height) => throw new NotImplementedException();

    /// <summary>pixels interleaved as gray, alpha.</summary>
    public static byte[] EncodeGrayAlpha(ReadOnlySpan<byte> pixels, int width, int height) => throw new NotImplementedException();
}
