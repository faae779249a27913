using Mosaic.Demo.Wcs;

namespace Mosaic.Demo.Camera;

/// <summary>Where a chip sits on the undistorted focal plane (pixels from the boresight) and how it is turned.</summary>
internal readonly struct ChipPlacement
{
    private readonly double _cos, _sin;

    public ChipPlacement(int width, int height, double centreX, double centreY, double rotationDegrees)
    {
        Width = width;
        Height = height;
        CentreX = centreX;
        CentreY = centreY;
        RotationDegrees = rotationDegrees;
        (_sin, _cos) = Math.SinCos(rotationDegrees * Math.PI / 180.0);
    }

    public int Width { get; }
    public int Height { get; }
    public double CentreX { get; }
    public double CentreY { get; }

    /// <summary>Counter-clockwise, pixel axes against focal-plane axes.</summary>
    public double RotationDegrees { get; }

    public (double X, double Y) ToFocalPlane(PixelPosition pixel)
    {
        var dx = pixel.X + 0.5 - Width / 2.0;
        var dy = pixel.Y + 0.5 - Height / 2.0;
        return (CentreX + _cos * dx - _sin * dy, CentreY + _sin * dx + _cos * dy);
    }

    public PixelPosition FromFocalPlane(double x, double y)
    {
        var dx = x - CentreX;
        var dy = y - CentreY;
        return new PixelPosition(_cos * dx + _sin * dy + Width / 2.0 - 0.5, -_sin * dx + _cos * dy + Height / 2.0 - 0.5);
    }
}
