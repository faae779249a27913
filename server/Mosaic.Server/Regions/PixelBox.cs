namespace Mosaic.Server.Regions;

/// <summary>A box of image pixels in FITS 1-based coordinates, both corners inclusive: columns X0..X1, rows Y0..Y1.</summary>
public readonly record struct PixelBox
{
    public PixelBox(int x0, int y0, int x1, int y1)
    {
        if (x0 < 1 || y0 < 1) throw new ArgumentOutOfRangeException(nameof(x0), "FITS pixel coordinates start at 1");
        if (x1 < x0) throw new ArgumentOutOfRangeException(nameof(x1), x1, $"x1 must be ≥ x0 ({x0})");
        if (y1 < y0) throw new ArgumentOutOfRangeException(nameof(y1), y1, $"y1 must be ≥ y0 ({y0})");
        X0 = x0;
        Y0 = y0;
        X1 = x1;
        Y1 = y1;
    }

    public int X0 { get; }
    public int Y0 { get; }
    public int X1 { get; }
    public int Y1 { get; }

    public int Width => X1 - X0 + 1;

    public int Height => Y1 - Y0 + 1;

    public long PixelCount => (long)Width * Height;

    /// <summary>The 0-based stored row (row 0 = FITS y 1) of the box's k-th row counted from its top, which is FITS y = Y1.</summary>
    public int StoredRowFromTop(int k) => Y1 - 1 - k;

    public bool FitsInside(int width, int height) => X1 <= width && Y1 <= height;
}
