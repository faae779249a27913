namespace Mosaic.Wcs.Projections;

/// <summary>
/// COP, Paper II section 5.5.1: C = sin(theta_a), R = (180/pi) cos(eta) (cot(theta_a) - tan(theta - theta_a))
///. The latitude theta_a - 90 diverges; the hemisphere away from theta_a's pole has no image.
/// </summary>
public sealed class ConicPerspectiveProjection : ConicProjection
{
    private readonly double _k, _cot;   // (180/pi) cos(eta), cot(theta_a)

    public ConicPerspectiveProjection(double thetaA, double eta) : base("COP", thetaA, eta)
    {
        _k = R2D * Math.Cos(eta * D2R);
        _cot = 1 / Math.Tan(thetaA * D2R);
        if (_k == 0) throw new Header.WcsHeaderException("PV2_2", "COP needs |eta| < 90");
        SetConstants("COP", Math.Sin(thetaA * D2R), _k * _cot);
    }

    protected override bool TryRadius(double theta, out double r)
    {
        var t = theta - ThetaA;
        var (s, c) = SinCosDegrees(t);
        r = double.NaN;
        if (c == 0) return false;                                         // the latitude of divergence
        if (Math.Abs(theta) == 90)
        {
            r = 0;                                                        // exact at the poles
            return (theta < 0) == (ThetaA < 0);
        }
        r = _k * (_cot - s / c);
        return r * C >= 0;                                                // beyond the apex the cone folds back
    }

    protected override bool TryTheta(double r, out double theta)
    {
        theta = ThetaA + Math.Atan(_cot - r / _k) * R2D;
        return true;
    }
}
