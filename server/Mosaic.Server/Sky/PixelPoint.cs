namespace Mosaic.Server.Sky;

/// <summary>A 1-based FITS pixel position (x to the right, y up).</summary>
public readonly record struct PixelPoint(double X, double Y);
