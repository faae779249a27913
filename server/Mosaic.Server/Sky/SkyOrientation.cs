using Mosaic.Wcs.Coordinates;

namespace Mosaic.Server.Sky;

/// <summary>
/// The sky's local frame at one pixel: unit vectors in pixel axes towards increasing Dec (north) and increasing RA
/// (east), and the pixel scale sqrt(|det J|) of the pixel → sky Jacobian J, in arcseconds per pixel.
/// </summary>
public sealed record SkyOrientation(PixelVector North, PixelVector East, double PixelScaleArcsec)
{
    // Half a pixel: small enough that the central difference is exact to far below a milliarcsecond, large enough
    // that the differences of unit vectors stay well above double rounding.
    private const double Step = 0.5;
    private const double RadiansToArcseconds = 180.0 * 3600.0 / Math.PI;

    /// <summary>The frame at 1-based pixel (x, y); null where the pixel or its neighbours have no sky position.</summary>
    public static SkyOrientation? At(Mosaic.Wcs.Wcs wcs, double x, double y)
    {
        ArgumentNullException.ThrowIfNull(wcs);
        if (!wcs.TryPixelToIcrs(x, y, out var centre)
            || !wcs.TryPixelToIcrs(x + Step, y, out var right) || !wcs.TryPixelToIcrs(x - Step, y, out var left)
            || !wcs.TryPixelToIcrs(x, y + Step, out var up) || !wcs.TryPixelToIcrs(x, y - Step, out var down))
            return null;

        var a = centre.RightAscension * Math.PI / 180;
        var d = centre.Declination * Math.PI / 180;
        // Local east and north unit vectors on the sphere at the centre.
        var east = (X: -Math.Sin(a), Y: Math.Cos(a), Z: 0.0);
        var north = (X: -Math.Sin(d) * Math.Cos(a), Y: -Math.Sin(d) * Math.Sin(a), Z: Math.Cos(d));
        var alongX = Difference(right, left);
        var alongY = Difference(up, down);
        // J maps a pixel step (dx, dy) to radians (east, north).
        double j11 = Dot(east, alongX), j12 = Dot(east, alongY);
        double j21 = Dot(north, alongX), j22 = Dot(north, alongY);
        var det = j11 * j22 - j12 * j21;
        if (!(Math.Abs(det) > 0) || !double.IsFinite(det)) return null;
        // J^-1 (0, 1) points north, J^-1 (1, 0) east.
        var northPixels = Unit(-j12 / det, j11 / det);
        var eastPixels = Unit(j22 / det, -j21 / det);
        return new SkyOrientation(northPixels, eastPixels, Math.Sqrt(Math.Abs(det)) * RadiansToArcseconds);
    }

    private static (double X, double Y, double Z) Difference(SkyPosition plus, SkyPosition minus)
    {
        var p = UnitVector(plus);
        var m = UnitVector(minus);
        return ((p.X - m.X) / (2 * Step), (p.Y - m.Y) / (2 * Step), (p.Z - m.Z) / (2 * Step));
    }

    private static (double X, double Y, double Z) UnitVector(SkyPosition position)
    {
        var a = position.RightAscension * Math.PI / 180;
        var d = position.Declination * Math.PI / 180;
        return (Math.Cos(d) * Math.Cos(a), Math.Cos(d) * Math.Sin(a), Math.Sin(d));
    }

    private static double Dot((double X, double Y, double Z) u, (double X, double Y, double Z) v) => u.X * v.X + u.Y * v.Y + u.Z * v.Z;

    private static PixelVector Unit(double dx, double dy)
    {
        var length = Math.Sqrt(dx * dx + dy * dy);
        return new PixelVector(dx / length, dy / length);
    }
}
