namespace Mosaic.Wcs.Projections;

/// <summary>PAR, Paper II section 5.3.2: x = phi (2 cos(2 theta/3) - 1), y = 180 sin(theta/3) (eqs. 100-101).</summary>
public sealed class ParabolicProjection : Projection
{
    public override double Theta0 => 0;

    public override bool TryPlaneToNative(double x, double y, out double phi, out double theta)
    {
        phi = theta = double.NaN;
        var s = y / 180;
        // |theta| <= 90 means |y| <= 180 sin(30 deg) = 90.
        if (!double.IsFinite(x) || !(Math.Abs(s) <= 0.5)) return false;
        var d = 1 - 4 * s * s;                         // eq. 102
        var p = d == 0 ? (x == 0 ? 0 : double.PositiveInfinity) : x / d;
        if (!(Math.Abs(p) <= 180 + 1e-12)) return false;
        phi = p;
        theta = 3 * Math.Asin(s) * R2D;                // eq. 103
        return true;
    }

    public override bool TryNativeToPlane(double phi, double theta, out double x, out double y)
    {
        x = y = double.NaN;
        if (!(phi is >= -180 and <= 180) || !(theta is >= -90 and <= 90)) return false;
        x = phi * (2 * Math.Cos(2 * theta / 3 * D2R) - 1);
        y = 180 * Math.Sin(theta / 3 * D2R);
        return true;
    }
}
