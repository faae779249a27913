using Mosaic.Wcs.Header;

namespace Mosaic.Wcs.Projections;

/// <summary>
/// BON, Paper II section 5.6.1: R = Y0 - theta, A = (180/pi) phi cos(theta) / R, x = R sin A, y = -R cos A + Y0
/// with Y0 = (180/pi) cot(theta_1) + theta_1, theta_1 = PV2_1 (required; 0 makes it SFL, which the
/// factory builds instead).
/// </summary>
public sealed class BonneProjection : Projection
{
    private const double Tolerance = 1e-11;
    private readonly double _theta1, _y0;

    /// <exception cref="WcsHeaderException">theta_1 is missing, zero (use SFL) or out of range.</exception>
    public BonneProjection(double theta1)
    {
        if (double.IsNaN(theta1)) throw new WcsHeaderException("PV2_1", "BON needs theta_1 in PV2_1");
        if (theta1 == 0 || !(Math.Abs(theta1) <= 90)) throw new WcsHeaderException("PV2_1", $"BON needs 0 < |theta_1| <= 90, got {theta1}");
        _theta1 = theta1;
        var (s, c) = SinCosDegrees(theta1);
        _y0 = R2D * c / s + theta1;
    }

    public override double Theta0 => 0;

    public override bool TryPlaneToNative(double x, double y, out double phi, out double theta)
    {
        phi = theta = double.NaN;
        if (!double.IsFinite(x) || !double.IsFinite(y)) return false;
        var dy = _y0 - y;
        var r = Math.Sqrt(x * x + dy * dy);
        if (_theta1 < 0) r = -r;
        var a = r == 0 ? 0 : Math.Atan2(x / r, dy / r) * R2D;
        theta = _y0 - r;
        var c = SinCosDegrees(theta).Cos;
        phi = c == 0 ? 0 : a * (r / R2D) / c;
        return InNativeRange(ref phi, ref theta, Tolerance);
    }

    public override bool TryNativeToPlane(double phi, double theta, out double x, out double y)
    {
        x = y = double.NaN;
        if (!(phi is >= -180 and <= 180) || !(theta is >= -90 and <= 90)) return false;
        var r = _y0 - theta;
        var a = R2D * phi * SinCosDegrees(theta).Cos / r;
        var (s, c) = SinCosDegrees(a);
        x = r * s;
        y = -r * c + _y0;
        return double.IsFinite(x) && double.IsFinite(y);
    }
}
