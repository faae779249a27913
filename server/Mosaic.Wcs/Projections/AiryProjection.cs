using Mosaic.Wcs.Header;

namespace Mosaic.Wcs.Projections;

/// <summary>
/// AIR, Paper II section 5.1.9: R = -2 (180/pi) (ln(cos xi)/tan xi + ln(cos xi_b)/tan^2 xi_b tan xi) with
/// xi = (90 - theta)/2, theta_b = PV2_1 (default 90, where the second term becomes -1/2 tan xi). The
/// south native pole has no image; the inverse solves R(xi) = R by bracketing and Newton's method.
/// </summary>
public sealed class AiryProjection : ZenithalProjection
{
    private const double SmallAngle = 1e-4;   // radians of xi below which the series R = 2 (1/2 - a) xi is exact enough
    private readonly double _a;               // ln(cos xi_b) / tan^2 xi_b

    /// <exception cref="WcsHeaderException">theta_b is not above -90.</exception>
    public AiryProjection(double thetaB)
    {
        if (!(thetaB > -90 && thetaB <= 90)) throw new WcsHeaderException("PV2_1", $"AIR needs -90 < theta_b <= 90, got {thetaB}");
        if (thetaB == 90) _a = -0.5;
        else
        {
            var c = Math.Cos((90 - thetaB) / 2 * D2R);
            _a = Math.Log(c) * c * c / (1 - c * c);
        }
    }

    protected override bool TryRadius(double theta, out double r)
    {
        r = double.NaN;
        if (theta <= -90) return false;
        r = 2 * R2D * Radius((90 - theta) / 2 * D2R);
        return true;
    }

    protected override bool TryTheta(double r, out double theta)
    {
        var target = r / (2 * R2D);
        theta = double.NaN;
        if (!double.IsFinite(target)) return false;
        double xi;
        if (target == 0) xi = 0;
        else if (target < (0.5 - _a) * SmallAngle) xi = target / (0.5 - _a);
        else
        {
            // Radius(xi) rises from 0 to infinity on [0, pi/2): bracket, then Newton kept inside the bracket.
            double lo = 0, hi = Math.PI / 4;
            while (Radius(hi) < target)
            {
                lo = hi;
                hi = 0.5 * (hi + Math.PI / 2);
                if (Math.PI / 2 - hi < 1e-12) return false;
            }
            xi = 0.5 * (lo + hi);
            for (var k = 0; k < 200; k++)
            {
                var f = Radius(xi) - target;
                if (f < 0) lo = xi; else hi = xi;
                var next = xi - f / Slope(xi);
                if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
                var done = Math.Abs(next - xi) < 1e-15 || hi - lo < 1e-15;
                xi = next;
                if (done) break;
            }
        }
        theta = 90 - 2 * xi * R2D;
        return theta >= -90;
    }

    /// <summary>R / (2 * 180/pi) as a function of xi in radians.</summary>
    private double Radius(double xi)
    {
        if (xi < SmallAngle) return (0.5 - _a) * xi;
        var c = Math.Cos(xi);
        var t = Math.Tan(xi);
        return -(Math.Log(c) / t + _a * t);
    }

    private double Slope(double xi)
    {
        if (xi < SmallAngle) return 0.5 - _a;
        double c = Math.Cos(xi), s = Math.Sin(xi);
        // d(ln(c)/t)/dxi = -1 - ln(c)/s^2 and d(a t)/dxi = a/c^2, so R' = 1 + ln(c)/s^2 - a/c^2.
        return 1 + Math.Log(c) / (s * s) - _a / (c * c);
    }
}
