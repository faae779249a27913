namespace Mosaic.Wcs.Projections;

/// <summary>CAR, Paper II section 5.2.3: x = phi, y = theta (eqs. 84-85), fiducial point at theta0 = 0.</summary>
public sealed class PlateCarreeProjection : Projection
{
    public override double Theta0 => 0;

    public override bool TryPlaneToNative(double x, double y, out double phi, out double theta)
    {
        phi = x; theta = y;
        if (double.IsFinite(x) && y is >= -90 and <= 90) return true;
        phi = theta = double.NaN;
        return false;
    }

    public override bool TryNativeToPlane(double phi, double theta, out double x, out double y)
    {
        x = phi; y = theta;
        if (double.IsFinite(phi) && theta is >= -90 and <= 90) return true;
        x = y = double.NaN;
        return false;
    }
}
