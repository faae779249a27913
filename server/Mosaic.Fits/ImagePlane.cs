using Microsoft.Win32.SafeHandles;

namespace Mosaic.Fits;

/// <summary>
/// One 2-D plane of an image HDU, read on demand with positional reads (never memory-mapped, so a file truncated
/// under us is an exception, not a SIGBUS). Coordinates here are 0-based: column x in [0, Width), stored row y in
/// [0, Height), where row 0 is FITS y = 1. Thread-safe.
/// </summary>
public sealed class ImagePlane
{
    // CONTRACT (filled in by the FITS reader work): constructor is internal to the library.
    internal ImagePlane(SafeFileHandle handle, string filePath, int hduIndex, int bitPix, int width, int height,
        double bScale, double bZero, long? blank, long dataOffset)
    {
        Handle = handle; FilePath = filePath; HduIndex = hduIndex; BitPix = bitPix; Width = width; Height = height;
        BScale = bScale; BZero = bZero; Blank = blank; DataOffset = dataOffset;
    }

    internal SafeFileHandle Handle { get; }
    public string FilePath { get; }
    public int HduIndex { get; }
    public int BitPix { get; }
    public int Width { get; }
    public int Height { get; }
    public double BScale { get; }
    public double BZero { get; }
    public long? Blank { get; }
    /// <summary>Byte offset of this plane's first pixel in the file.</summary>
    public long DataOffset { get; }
    public int BytesPerPixel => Math.Abs(BitPix) / 8;

    /// <summary>Physical values (BZERO + BSCALE * stored) of row y, columns [x, x + destination.Length); NaN where BLANK or NaN.</summary>
    public void ReadRow(int y, int x, Span<float> destination) => throw new NotImplementedException();

    /// <summary>Full-width rows [y, y + rowCount) into destination (rowCount * Width floats), row y first.</summary>
    public void ReadRows(int y, int rowCount, Span<float> destination) => throw new NotImplementedException();

    /// <summary>One physical value in double precision (for BITPIX 32, 64, -64 a float would round); NaN where masked.</summary>
    public double ReadValue(int x, int y) => throw new NotImplementedException();
}
