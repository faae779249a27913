namespace Mosaic.Wcs.Projections;

/// <summary>
/// A spherical projection of FITS WCS Paper II (Calabretta &amp; Greisen 2002): native spherical (phi, theta) to
/// projection-plane (x, y), all in degrees. A Try method returns false where the point has no image.
/// </summary>
public abstract class Projection
{
    /// <summary>Native longitude of the fiducial point (Paper II section 2.5), degrees.</summary>
    public virtual double Phi0 => 0;

    /// <summary>Native latitude of the fiducial point, degrees: 90 for zenithal projections.</summary>
    public abstract double Theta0 { get; }

    public abstract bool TryPlaneToNative(double x, double y, out double phi, out double theta);

    public abstract bool TryNativeToPlane(double phi, double theta, out double x, out double y);

    internal const double D2R = Math.PI / 180;
    internal const double R2D = 180 / Math.PI;

    /// <summary>Sine and cosine of an angle in degrees, exact at multiples of 90 so poles and quadrants stay exact.</summary>
    internal static (double Sin, double Cos) SinCosDegrees(double degrees)
    {
        var r = Math.IEEERemainder(degrees, 360);
        return r switch
        {
            0 => (0, 1),
            90 => (1, 0),
            -90 => (-1, 0),
            180 or -180 => (0, -1),
            _ => Math.SinCos(r * D2R),
        };
    }

    /// <summary>
    /// Accepts native coordinates within rounding of [-180, 180] x [-90, 90], clamping them in; false otherwise
    /// (the same 1e-13 degree slack as the inverse equations' own rounding).
    /// </summary>
    internal static bool InNativeRange(ref double phi, ref double theta, double tolerance = 1e-13)
    {
        if (!(Math.Abs(phi) <= 180 + tolerance) || !(Math.Abs(theta) <= 90 + tolerance))
        {
            phi = theta = double.NaN;
            return false;
        }
        phi = Math.Clamp(phi, -180, 180);
        theta = Math.Clamp(theta, -90, 90);
        return true;
    }
}
