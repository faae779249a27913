namespace Mosaic.Wcs.Projections;

/// <summary>
/// CYP, Paper II section 5.2.1: x = lambda phi, y = (180/pi) (mu + lambda) sin(theta) / (mu + cos(theta)) (eqs. 76-77),
/// mu = PV2_1, lambda = PV2_2 (both default 1).
/// </summary>
public sealed class CylindricalPerspectiveProjection : Projection
{
    private readonly double _mu, _lambda;

    /// <exception cref="Header.WcsHeaderException">mu = -lambda or lambda = 0, where the projection degenerates.</exception>
    public CylindricalPerspectiveProjection(double mu, double lambda)
    {
        if (lambda == 0) throw new Header.WcsHeaderException("PV2_2", "CYP needs lambda != 0");
        if (mu + lambda == 0) throw new Header.WcsHeaderException("PV2_1", "CYP needs mu != -lambda");
        _mu = mu; _lambda = lambda;
    }

    public override double Theta0 => 0;

    public override bool TryPlaneToNative(double x, double y, out double phi, out double theta)
    {
        phi = theta = double.NaN;
        if (!double.IsFinite(x) || !double.IsFinite(y)) return false;
        var eta = y * D2R / (_mu + _lambda);
        var s = eta * _mu / Math.Sqrt(eta * eta + 1);
        if (!(Math.Abs(s) <= 1)) return false;
        var t = (Math.Atan2(eta, 1) + Math.Asin(s)) * R2D;   // eq. 79
        if (!(t is >= -90 - 1e-12 and <= 90 + 1e-12)) return false;
        phi = x / _lambda;                                   // eq. 78
        theta = Math.Clamp(t, -90, 90);
        return true;
    }

    public override bool TryNativeToPlane(double phi, double theta, out double x, out double y)
    {
        x = y = double.NaN;
        if (!double.IsFinite(phi) || !(theta is >= -90 and <= 90)) return false;
        var t = theta * D2R;
        var d = _mu + Math.Cos(t);
        if (d <= 0) return false;   // the perspective point's side of the sphere diverges or folds over
        x = _lambda * phi;
        y = R2D * (_mu + _lambda) * Math.Sin(t) / d;
        return true;
    }
}
