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
}
