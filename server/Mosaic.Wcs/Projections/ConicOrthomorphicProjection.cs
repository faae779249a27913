namespace Mosaic.Wcs.Projections;

/// <summary>
/// COO, Paper II section 5.5.4 (Lambert's conformal conic): C = ln(cos theta_2 / cos theta_1) /
/// ln(tan tau_2 / tan tau_1) with tau = (90 - theta)/2 (C = sin theta_1 when theta_1 = theta_2), and
/// R = psi tan(tau)^C, psi = (180/pi) cos(theta_1) / (C tan(tau_1)^C). The pole away from theta_a's
/// side diverges.
/// </summary>
public sealed class ConicOrthomorphicProjection : ConicProjection
{
    private readonly double _psi;

    public ConicOrthomorphicProjection(double thetaA, double eta) : base("COO", thetaA, eta)
    {
        double theta1 = thetaA - eta, theta2 = thetaA + eta;
        var tan1 = Math.Tan((90 - theta1) / 2 * D2R);
        var cos1 = Math.Cos(theta1 * D2R);
        var c = theta1 == theta2
            ? Math.Sin(theta1 * D2R)
            : Math.Log(Math.Cos(theta2 * D2R) / cos1) / Math.Log(Math.Tan((90 - theta2) / 2 * D2R) / tan1);
        if (c == 0 || !double.IsFinite(c)) throw new Header.WcsHeaderException("PV2_1", $"COO: no cone constant for theta_a = {thetaA}, eta = {eta}");
        _psi = R2D * (cos1 / c) / Math.Pow(tan1, c);
        if (_psi == 0 || !double.IsFinite(_psi)) throw new Header.WcsHeaderException("PV2_1", $"COO: degenerate for theta_a = {thetaA}, eta = {eta}");
        SetConstants("COO", c, _psi * Math.Pow(Math.Tan((90 - thetaA) / 2 * D2R), c));
    }

    protected override bool TryRadius(double theta, out double r)
    {
        r = double.NaN;
        if (theta == -90)
        {
            if (C >= 0) return false;   // the pole opposite the cone's apex lies at infinity
            r = 0;
            return true;
        }
        r = _psi * Math.Pow(Math.Tan((90 - theta) / 2 * D2R), C);
        return double.IsFinite(r);
    }

    protected override bool TryTheta(double r, out double theta)
    {
        theta = double.NaN;
        if (r == 0)
        {
            if (C >= 0) return false;
            theta = -90;
            return true;
        }
        theta = 90 - 2 * Math.Atan(Math.Pow(r / _psi, 1 / C)) * R2D;
        return true;
    }
}
