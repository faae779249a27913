namespace Mosaic.Demo.Wcs;

/// <summary>A position in a chip's pixel grid, 0-based: (0, 0) is the centre of the first stored pixel (FITS pixel (1, 1)).</summary>
public readonly record struct PixelPosition(double X, double Y);
