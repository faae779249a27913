using Mosaic.Wcs.Header;

namespace Mosaic.Wcs.Projections;

/// <summary>
/// Conic projections (Paper II section 5.5): x = R sin(C phi), y = -R cos(C phi) + Y0 with Y0 = R(theta_a)
///, and the inverse R = sign(theta_a) sqrt(x^2 + (Y0 - y)^2), phi = arg(Y0 - y, x) / C.
/// theta_a = PV2_1 (required) is the fiducial latitude, eta = PV2_2 (default 0) half the distance between the
/// standard parallels theta_a -/+ eta; each subclass gives C, R(theta) and its inverse.
/// </summary>
public abstract class ConicProjection : Projection
{
    private double _c, _y0;

    /// <exception cref="WcsHeaderException">theta_a is missing or out of range.</exception>
    protected ConicProjection(string code, double thetaA, double eta)
    {
        if (double.IsNaN(thetaA)) throw new WcsHeaderException("PV2_1", $"{code} needs theta_a in PV2_1");
        if (!(Math.Abs(thetaA) < 90)) throw new WcsHeaderException("PV2_1", $"{code} needs |theta_a| < 90, got {thetaA}");
        if (!(Math.Abs(eta) < 90)) throw new WcsHeaderException("PV2_2", $"{code} needs |eta| < 90, got {eta}");
        ThetaA = thetaA;
        Eta = eta;
    }

    public double ThetaA { get; }
    public double Eta { get; }

    public sealed override double Theta0 => ThetaA;

    /// <summary>Called once by the subclass constructor with C and Y0 = R(theta_a).</summary>
    protected void SetConstants(string code, double c, double y0)
    {
        if (c == 0 || !double.IsFinite(c)) throw new WcsHeaderException("PV2_1", $"{code}: the cone constant is {c} for theta_a = {ThetaA}, eta = {Eta}");
        _c = c; _y0 = y0;
    }

    protected double C => _c;

    protected abstract bool TryRadius(double theta, out double r);

    /// <summary>theta from R (R carries the sign of theta_a).</summary>
    protected abstract bool TryTheta(double r, out double theta);

    public override bool TryPlaneToNative(double x, double y, out double phi, out double theta)
    {
        phi = theta = double.NaN;
        if (!double.IsFinite(x) || !double.IsFinite(y)) return false;
        var dy = _y0 - y;
        var r = Math.Sqrt(x * x + dy * dy);
        if (ThetaA < 0) r = -r;
        var alpha = r == 0 ? 0 : Math.Atan2(x / r, dy / r) * R2D;
        if (!TryTheta(r, out theta)) { theta = double.NaN; return false; }
        phi = alpha / _c;
        return InNativeRange(ref phi, ref theta);
    }

    public override bool TryNativeToPlane(double phi, double theta, out double x, out double y)
    {
        x = y = double.NaN;
        if (!(phi is >= -180 and <= 180) || !(theta is >= -90 and <= 90)) return false;
        if (!TryRadius(theta, out var r) || !double.IsFinite(r)) return false;
        var (s, c) = SinCosDegrees(_c * phi);
        x = r * s;
        y = -r * c + _y0;
        return true;
    }
}
