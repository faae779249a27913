namespace Mosaic.Imaging.Encoding;

/// <summary>The PNG colour types this writer emits, all at bit depth 8 (PNG specification, table 11.1).</summary>
public enum PngColorType : byte
{
    Gray = 0,
    Rgb = 2,
    Indexed = 3,
    GrayAlpha = 4,
    Rgba = 6,
}
