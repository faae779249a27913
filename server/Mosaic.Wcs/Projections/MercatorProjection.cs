namespace Mosaic.Wcs.Projections;

/// <summary>MER, Paper II section 5.2.6: x = phi, y = (180/pi) ln tan((90 + theta)/2) (eqs. 92-93); the poles have no image.</summary>
public sealed class MercatorProjection : Projection
{
    public override double Theta0 => 0;

    public override bool TryPlaneToNative(double x, double y, out double phi, out double theta)
    {
        phi = x;
        theta = 2 * Math.Atan(Math.Exp(y * D2R)) * R2D - 90;   // eq. 95
        if (double.IsFinite(x) && double.IsFinite(y)) return true;
        phi = theta = double.NaN;
        return false;
    }

    public override bool TryNativeToPlane(double phi, double theta, out double x, out double y)
    {
        x = y = double.NaN;
        if (!double.IsFinite(phi) || !(theta is > -90 and < 90)) return false;
        x = phi;
        y = R2D * Math.Log(Math.Tan((90 + theta) / 2 * D2R));
        return true;
    }
}
