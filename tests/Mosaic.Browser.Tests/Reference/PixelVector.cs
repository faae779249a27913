namespace Mosaic.Browser.Tests.Reference;

/// <summary>A unit vector in FITS pixel axes: x to the right, y up.</summary>
public sealed record PixelVector(double Dx, double Dy);
