namespace Mosaic.Wcs.Projections;

/// <summary>AIT, Paper II section 5.3.4: eqs. 107-110; plane points with Z^2 &lt; 1/2 lie outside the ellipse.</summary>
public sealed class HammerAitoffProjection : Projection
{
    public override double Theta0 => 0;

    public override bool TryPlaneToNative(double x, double y, out double phi, out double theta)
    {
        phi = theta = double.NaN;
        double a = x * Math.PI / 720, b = y * Math.PI / 360;
        var z2 = 1 - a * a - b * b;
        if (!(z2 >= 0.5 - 1e-14)) return false;
        z2 = Math.Max(z2, 0.5);
        var z = Math.Sqrt(z2);
        phi = 2 * Math.Atan2(z * x * Math.PI / 360, 2 * z2 - 1) * R2D;       // eq. 109
        theta = Math.Asin(Math.Clamp(y * z * D2R, -1, 1)) * R2D;           // eq. 110
        return true;
    }

    public override bool TryNativeToPlane(double phi, double theta, out double x, out double y)
    {
        x = y = double.NaN;
        if (!(phi is >= -180 and <= 180) || !(theta is >= -90 and <= 90)) return false;
        double ct = Math.Cos(theta * D2R), half = phi / 2 * D2R;
        var gamma = R2D * Math.Sqrt(2 / (1 + ct * Math.Cos(half)));         // eq. 107
        x = 2 * gamma * ct * Math.Sin(half);
        y = gamma * Math.Sin(theta * D2R);                                   // eq. 108
        return true;
    }
}
