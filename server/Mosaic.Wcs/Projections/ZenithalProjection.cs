namespace Mosaic.Wcs.Projections;

/// <summary>
/// Zenithal projections (Paper II section 5.1): x = R sin phi, y = -R cos phi (eqs. 12-13), and the inverse
/// phi = atan2(x, -y), R = sqrt(x^2 + y^2) (eqs. 14-15); each subclass gives R(theta) and its inverse.
/// </summary>
public abstract class ZenithalProjection : Projection
{
    public sealed override double Theta0 => 90;

    protected abstract bool TryRadius(double theta, out double r);

    protected abstract bool TryTheta(double r, out double theta);

    public override bool TryPlaneToNative(double x, double y, out double phi, out double theta)
    {
        var r = Math.Sqrt(x * x + y * y);
        phi = r == 0 ? 0 : Math.Atan2(x, -y) * R2D;
        if (!double.IsFinite(r) || !TryTheta(r, out theta)) { phi = theta = double.NaN; return false; }
        return true;
    }

    public override bool TryNativeToPlane(double phi, double theta, out double x, out double y)
    {
        if (!double.IsFinite(phi) || !(theta is >= -90 and <= 90) || !TryRadius(theta, out var r))
        {
            x = y = double.NaN;
            return false;
        }
        var p = phi * D2R;
        x = r * Math.Sin(p);
        y = -r * Math.Cos(p);
        return true;
    }
}
