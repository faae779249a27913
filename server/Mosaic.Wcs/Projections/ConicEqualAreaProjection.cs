namespace Mosaic.Wcs.Projections;

/// <summary>
/// COE, Paper II section 5.5.2: gamma = sin(theta_1) + sin(theta_2), C = gamma/2,
/// R = (180/pi) (2/gamma) sqrt(1 + sin(theta_1) sin(theta_2) - gamma sin(theta)); the whole sphere
/// has an image.
/// </summary>
public sealed class ConicEqualAreaProjection : ConicProjection
{
    private const double Tolerance = 1e-12;
    private readonly double _chi, _psi, _gamma, _southRadius;

    public ConicEqualAreaProjection(double thetaA, double eta) : base("COE", thetaA, eta)
    {
        double s1 = Math.Sin((thetaA - eta) * D2R), s2 = Math.Sin((thetaA + eta) * D2R);
        _gamma = s1 + s2;
        if (_gamma == 0) throw new Header.WcsHeaderException("PV2_1", "COE needs sin(theta_a - eta) + sin(theta_a + eta) != 0");
        _chi = 2 * R2D / _gamma;
        _psi = 1 + s1 * s2;
        _southRadius = _chi * Math.Sqrt(_psi + _gamma);
        SetConstants("COE", _gamma / 2, _chi * Math.Sqrt(_psi - _gamma * Math.Sin(thetaA * D2R)));
    }

    protected override bool TryRadius(double theta, out double r)
    {
        r = theta == -90 ? _southRadius : _chi * Math.Sqrt(_psi - _gamma * SinCosDegrees(theta).Sin);
        return true;
    }

    protected override bool TryTheta(double r, out double theta)
    {
        theta = double.NaN;
        if (Math.Abs(r - _southRadius) < Tolerance) { theta = -90; return true; }
        // sin(theta) = (psi - (R/chi)^2) / gamma.
        var w = (_psi - r * r / (_chi * _chi)) / _gamma;
        if (Math.Abs(w) > 1)
        {
            if (Math.Abs(w - 1) < Tolerance) theta = 90;
            else if (Math.Abs(w + 1) < Tolerance) theta = -90;
            else return false;
            return true;
        }
        theta = Math.Asin(w) * R2D;
        return true;
    }
}
