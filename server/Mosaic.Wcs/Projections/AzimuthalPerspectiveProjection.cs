using Mosaic.Wcs.Header;

namespace Mosaic.Wcs.Projections;

/// <summary>
/// AZP, Paper II section 5.1.1: the perspective zenithal projection from a point mu sphere radii beyond the centre,
/// onto a plane tilted by gamma, mu = PV2_1, gamma = PV2_2 (degrees), both default 0. Points past the
/// horizon of the perspective point (theta &lt; asin(-1/mu) when |mu| &gt; 1) or beyond the divergence of a tilted
/// plane have no image; of the two sky solutions of a plane point the one nearer the native pole is taken.
/// </summary>
public sealed class AzimuthalPerspectiveProjection : Projection
{
    private const double Tolerance = 1e-13;
    private readonly double _mu, _scale, _cosGamma, _sinGamma, _tanGamma, _overlapTheta;
    private readonly bool _mayDiverge;

    /// <exception cref="WcsHeaderException">mu = -1 or |gamma| = 90, where the projection degenerates.</exception>
    public AzimuthalPerspectiveProjection(double mu, double gamma)
    {
        _mu = mu;
        _scale = R2D * (mu + 1);
        if (_scale == 0) throw new WcsHeaderException("PV2_1", "AZP needs mu != -1");
        (_sinGamma, _cosGamma) = SinCosDegrees(gamma);
        if (_cosGamma == 0) throw new WcsHeaderException("PV2_2", "AZP needs |gamma| < 90");
        _tanGamma = _sinGamma / _cosGamma;
        // beyond theta = asin(-1/mu) the far side of the sphere overlaps the near side.
        _overlapTheta = Math.Abs(mu) > 1 ? Math.Asin(-1 / mu) * R2D : -90;
        // A tilted plane meets the lines of sight at infinity only when |mu cos gamma| < 1.
        _mayDiverge = Math.Abs(mu * _cosGamma) < 1;
    }

    public override double Theta0 => 90;

    public override bool TryPlaneToNative(double x, double y, out double phi, out double theta)
    {
        phi = theta = double.NaN;
        if (!double.IsFinite(x) || !double.IsFinite(y)) return false;
        var yc = y * _cosGamma;
        var r = Math.Sqrt(x * x + yc * yc);
        if (r == 0) { phi = 0; theta = 90; return true; }
        phi = Math.Atan2(x, -yc) * R2D;
        var rho = r / (_scale + y * _sinGamma);
        var s = rho * _mu / Math.Sqrt(rho * rho + 1);
        var psi = Math.Atan2(1, rho) * R2D;
        double omega;
        if (Math.Abs(s) > 1)
        {
            if (Math.Abs(s) > 1 + Tolerance) { phi = double.NaN; return false; }
            omega = Math.CopySign(90, s);
        }
        else omega = Math.Asin(s) * R2D;
        // The two solutions psi - omega and psi + omega + 180: the one nearer the pole (larger theta) is the visible one.
        double a = psi - omega, b = psi + omega + 180;
        if (a > 90) a -= 360;
        if (b > 90) b -= 360;
        theta = Math.Max(a, b);
        return InNativeRange(ref phi, ref theta);
    }

    public override bool TryNativeToPlane(double phi, double theta, out double x, out double y)
    {
        x = y = double.NaN;
        if (!double.IsFinite(phi) || !(theta is >= -90 and <= 90)) return false;
        var (sinPhi, cosPhi) = SinCosDegrees(phi);
        var (sinTheta, cosTheta) = SinCosDegrees(theta);
        var s = _tanGamma * cosPhi;
        var d = _mu + sinTheta + cosTheta * s;
        if (d == 0) return false;
        if (theta < _overlapTheta) return false;
        if (_mayDiverge)
        {
            // the latitude where the denominator of R vanishes along this meridian.
            var t = _mu / Math.Sqrt(1 + s * s);
            if (Math.Abs(t) <= 1)
            {
                double alpha = Math.Atan(-s) * R2D, beta = Math.Asin(t) * R2D;
                double a = alpha - beta, b = alpha + beta + 180;
                if (a > 90) a -= 360;
                if (b > 90) b -= 360;
                if (theta < Math.Max(a, b)) return false;
            }
        }
        var r = _scale * cosTheta / d;
        x = r * sinPhi;
        y = -r * cosPhi / _cosGamma;
        return true;
    }
}
