namespace Mosaic.Fits;

/// <summary>
/// One 2-D plane of pixel values, read on demand. Coordinates here are 0-based: column x in [0, Width), stored row y
/// in [0, Height), where row 0 is FITS y = 1. Values are physical (scaling applied), NaN where masked. Implementations
/// are thread-safe. The argument checks live here, so a subclass's cores only ever see valid, non-empty requests.
/// </summary>
public abstract class ImagePlane
{
    protected ImagePlane(string filePath, int hduIndex, int bitPix, int width, int height)
    {
        ArgumentNullException.ThrowIfNull(filePath);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(width);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(height);
        if (bitPix is not (8 or 16 or 32 or 64 or -32 or -64))
            throw new ArgumentOutOfRangeException(nameof(bitPix), bitPix, "BITPIX must be 8, 16, 32, 64, -32 or -64.");
        FilePath = filePath; HduIndex = hduIndex; BitPix = bitPix; Width = width; Height = height;
    }

    public string FilePath { get; }

    /// <summary>The HDU this plane belongs to (0 is the primary); negative for a plane that is not one HDU's data.</summary>
    public int HduIndex { get; }

    /// <summary>The BITPIX of the values as the data define them (for a compressed image, the original ZBITPIX).</summary>
    public int BitPix { get; }

    public int Width { get; }
    public int Height { get; }

    /// <summary>Physical values of row y, columns [x, x + destination.Length); NaN where BLANK or NaN.</summary>
    public void ReadRow(int y, int x, Span<float> destination)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(y);
        ArgumentOutOfRangeException.ThrowIfGreaterThanOrEqual(y, Height);
        ArgumentOutOfRangeException.ThrowIfNegative(x);
        ArgumentOutOfRangeException.ThrowIfGreaterThan(x, Width);
        if (destination.Length > Width - x)
            throw new ArgumentOutOfRangeException(nameof(destination), destination.Length,
                $"columns [{x}, {x + (long)destination.Length}) run past the row width {Width}.");
        if (destination.IsEmpty) return;
        ReadRowCore(y, x, destination);
    }

    /// <summary>Full-width rows [y, y + rowCount) into destination (rowCount * Width floats), row y first.</summary>
    public void ReadRows(int y, int rowCount, Span<float> destination)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(y);
        ArgumentOutOfRangeException.ThrowIfNegative(rowCount);
        if ((long)y + rowCount > Height)
            throw new ArgumentOutOfRangeException(nameof(rowCount), rowCount, $"rows [{y}, {(long)y + rowCount}) run past the height {Height}.");
        var needed = (long)rowCount * Width;
        if (destination.Length < needed)
            throw new ArgumentOutOfRangeException(nameof(destination), destination.Length, $"{rowCount} rows need {needed} floats.");
        if (rowCount == 0) return;
        ReadRowsCore(y, rowCount, destination[..(int)needed]);
    }

    /// <summary>
    /// Columns [x, x + width) of rowCount rows into destination (rowCount * width floats, row after row): rows y,
    /// y + 1, … where rowStep is 1, or y, y - 1, … (the top row of a display first) where it is -1. One call for a
    /// tile's rows, so a plane can read them without a per-row round of checks.
    /// </summary>
    public void ReadBlock(int x, int y, int width, int rowCount, int rowStep, Span<float> destination)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(x);
        ArgumentOutOfRangeException.ThrowIfNegative(width);
        ArgumentOutOfRangeException.ThrowIfNegative(rowCount);
        if ((long)x + width > Width)
            throw new ArgumentOutOfRangeException(nameof(width), width, $"columns [{x}, {(long)x + width}) run past the row width {Width}.");
        if (rowStep is not (1 or -1)) throw new ArgumentOutOfRangeException(nameof(rowStep), rowStep, "rowStep must be 1 or -1.");
        var needed = (long)rowCount * width;
        if (destination.Length < needed)
            throw new ArgumentOutOfRangeException(nameof(destination), destination.Length, $"{rowCount} rows of {width} need {needed} floats.");
        if (needed == 0) return;
        var last = y + (long)(rowCount - 1) * rowStep;
        if (y < 0 || y >= Height || last < 0 || last >= Height)
            throw new ArgumentOutOfRangeException(nameof(y), y, $"rows {y} to {last} run outside the height {Height}.");
        ReadBlockCore(x, y, width, rowCount, rowStep, destination[..(int)needed]);
    }

    /// <summary>One physical value in double precision (for BITPIX 32, 64, -64 a float would round); NaN where masked.</summary>
    public double ReadValue(int x, int y)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(x);
        ArgumentOutOfRangeException.ThrowIfGreaterThanOrEqual(x, Width);
        ArgumentOutOfRangeException.ThrowIfNegative(y);
        ArgumentOutOfRangeException.ThrowIfGreaterThanOrEqual(y, Height);
        return ReadValueCore(x, y);
    }

    /// <summary>Called with 0 ≤ y &lt; Height, 0 ≤ x, a non-empty destination and x + destination.Length ≤ Width.</summary>
    protected abstract void ReadRowCore(int y, int x, Span<float> destination);

    /// <summary>Called with rowCount ≥ 1, rows inside the plane and destination exactly rowCount * Width long.</summary>
    protected abstract void ReadRowsCore(int y, int rowCount, Span<float> destination);

    /// <summary>
    /// Called with every row inside the plane, width ≥ 1, x + width ≤ Width and destination exactly rowCount * width
    /// long. Row by row through <see cref="ReadRowCore"/> unless a plane has something cheaper.
    /// </summary>
    protected virtual void ReadBlockCore(int x, int y, int width, int rowCount, int rowStep, Span<float> destination)
    {
        for (var j = 0; j < rowCount; j++) ReadRowCore(y + j * rowStep, x, destination.Slice(j * width, width));
    }

    /// <summary>Called with (x, y) inside the plane.</summary>
    protected abstract double ReadValueCore(int x, int y);
}
