namespace Mosaic.Wcs.Projections;

/// <summary>SFL, Paper II section 5.3.1: x = phi cos(theta), y = theta (eqs. 97-98); |phi| &gt; 180 has no sky position.</summary>
public sealed class SansonFlamsteedProjection : Projection
{
    public override double Theta0 => 0;

    public override bool TryPlaneToNative(double x, double y, out double phi, out double theta)
    {
        phi = theta = double.NaN;
        if (!double.IsFinite(x) || !(y is >= -90 and <= 90)) return false;
        var c = Math.Cos(y * D2R);
        var p = c == 0 ? (x == 0 ? 0 : double.PositiveInfinity) : x / c;   // eq. 99
        if (!(Math.Abs(p) <= 180 + 1e-12)) return false;
        phi = p; theta = y;
        return true;
    }

    public override bool TryNativeToPlane(double phi, double theta, out double x, out double y)
    {
        x = y = double.NaN;
        if (!(phi is >= -180 and <= 180) || !(theta is >= -90 and <= 90)) return false;
        x = phi * Math.Cos(theta * D2R);
        y = theta;
        return true;
    }
}
