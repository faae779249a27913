using Mosaic.Wcs.Header;

namespace Mosaic.Wcs.Projections;

/// <summary>
/// SZP, Paper II section 5.1.2: the perspective projection from a point mu sphere radii from the centre in the
/// direction (phi_c, theta_c), mu = PV2_1 (default 0), phi_c = PV2_2 (default 0), theta_c = PV2_3
/// (default 90). Points beyond the divergence, or hidden behind the near side when |mu| &gt; 1, have no image; of the
/// two sky solutions of a plane point the one nearer the native pole is taken.
/// </summary>
public sealed class SlantZenithalPerspectiveProjection : Projection
{
    private const double Tolerance = 1e-13;
    private readonly double _mu, _xp, _yp, _zp, _divergenceTheta;

    /// <exception cref="WcsHeaderException">mu sin(theta_c) = -1, where the projection degenerates.</exception>
    public SlantZenithalPerspectiveProjection(double mu, double phiC, double thetaC)
    {
        _mu = mu;
        var (sinPhiC, cosPhiC) = SinCosDegrees(phiC);
        var (sinThetaC, cosThetaC) = SinCosDegrees(thetaC);
        // the perspective point in plane units, the plane touching the sphere at the native pole.
        _xp = -mu * cosThetaC * sinPhiC;
        _yp = mu * cosThetaC * cosPhiC;
        _zp = mu * sinThetaC + 1;
        if (_zp == 0) throw new WcsHeaderException("PV2_1", "SZP needs mu sin(theta_c) != -1");
        // Lines of sight parallel to the plane: 1 - sin(theta) = z_p.
        _divergenceTheta = Math.Abs(_zp - 1) < 1 ? Math.Asin(1 - _zp) * R2D : -90;
    }

    public override double Theta0 => 90;

    public override bool TryPlaneToNative(double x, double y, out double phi, out double theta)
    {
        phi = theta = double.NaN;
        if (!double.IsFinite(x) || !double.IsFinite(y)) return false;
        double xr = x * D2R, yr = y * D2R;
        var r2 = xr * xr + yr * yr;
        double x1 = (xr - _xp) / _zp, y1 = (yr - _yp) / _zp;
        var xy = xr * x1 + yr * y1;
        double z;
        if (r2 < 1e-10)
        {
            // Small-angle form near the pole, where the quadratic loses its digits.
            theta = 90 - R2D * Math.Sqrt(r2 / (1 + xy));
            z = r2 / 2;
        }
        else
        {
            // a quadratic in sin(theta).
            var t = x1 * x1 + y1 * y1;
            double a = t + 1, b = xy - t, c = r2 - xy - xy + t - 1;
            var d = b * b - a * c;
            if (d < 0) { theta = double.NaN; return false; }
            d = Math.Sqrt(d);
            double s1 = (-b + d) / a, s2 = (-b - d) / a;
            var sinTheta = Math.Max(s1, s2);
            if (sinTheta > 1) sinTheta = sinTheta - 1 < Tolerance ? 1 : Math.Min(s1, s2);
            if (sinTheta < -1 && sinTheta + 1 > -Tolerance) sinTheta = -1;
            if (!(Math.Abs(sinTheta) <= 1)) { theta = double.NaN; return false; }
            theta = Math.Asin(sinTheta) * R2D;
            z = 1 - sinTheta;
        }
        phi = Math.Atan2(xr - x1 * z, -(yr - y1 * z)) * R2D;
        return InNativeRange(ref phi, ref theta);
    }

    public override bool TryNativeToPlane(double phi, double theta, out double x, out double y)
    {
        x = y = double.NaN;
        if (!double.IsFinite(phi) || !(theta is >= -90 and <= 90)) return false;
        var (sinPhi, cosPhi) = SinCosDegrees(phi);
        var (sinTheta, cosTheta) = SinCosDegrees(theta);
        var s = 1 - sinTheta;
        var t = _zp - s;
        if (t == 0 || theta < _divergenceTheta) return false;
        if (Math.Abs(_mu) > 1 && Hidden(theta, sinPhi, cosPhi)) return false;
        var r = R2D * _zp * cosTheta / t;
        x = r * sinPhi - R2D * _xp * s / t;
        y = -r * cosPhi - R2D * _yp * s / t;
        return true;
    }

    /// <summary>
    /// True where the line of sight from the perspective point meets the sphere first elsewhere: beyond the latitude
    /// where it touches the sphere, P . S = 1 with P the perspective point from the centre and S the sky point.
    /// </summary>
    private bool Hidden(double theta, double sinPhi, double cosPhi)
    {
        // P . S = s cos(theta) - q sin(theta) with q = z_p - 1, s = x_p sin(phi) - y_p cos(phi).
        double s = _xp * sinPhi - _yp * cosPhi, q = _zp - 1;
        var t = 1 / Math.Sqrt(q * q + s * s);
        if (!(t <= 1)) return false;
        double alpha = Math.Atan2(s, q) * R2D, beta = Math.Asin(t) * R2D;
        double a = alpha - beta, b = alpha + beta + 180;
        if (a > 90) a -= 360;
        if (b > 90) b -= 360;
        return theta < Math.Max(a, b);
    }
}
