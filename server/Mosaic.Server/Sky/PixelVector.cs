namespace Mosaic.Server.Sky;

/// <summary>A direction in pixel axes (x to the right, y up).</summary>
public readonly record struct PixelVector(double Dx, double Dy);
