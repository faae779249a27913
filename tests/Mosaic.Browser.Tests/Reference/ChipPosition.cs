namespace Mosaic.Browser.Tests.Reference;

/// <summary>Where a sky position falls in one HDU's pixels, as astropy computes it (FITS 1-based), and that HDU's size.</summary>
public sealed record ChipPosition(int Hdu, double X, double Y, int Width, int Height)
{
    /// <summary>On the chip's pixels: pixel i covers [i - 0.5, i + 0.5) (the API's documented convention).</summary>
    public bool OnChip => X >= 0.5 && X < Width + 0.5 && Y >= 0.5 && Y < Height + 0.5;
}
