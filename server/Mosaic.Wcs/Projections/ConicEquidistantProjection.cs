namespace Mosaic.Wcs.Projections;

/// <summary>
/// COD, Paper II section 5.5.3: C = (180/pi) sin(theta_a) sin(eta) / eta, R = theta_a - theta + eta cot(eta)
/// cot(theta_a), eta in degrees in the product; C = sin(theta_a) when eta = 0.
/// </summary>
public sealed class ConicEquidistantProjection : ConicProjection
{
    private readonly double _offset;   // R + theta = theta_a + eta cot(eta) cot(theta_a)

    public ConicEquidistantProjection(double thetaA, double eta) : base("COD", thetaA, eta)
    {
        var sinA = Math.Sin(thetaA * D2R);
        var c = eta == 0 ? sinA : sinA * Math.Sin(eta * D2R) / (eta * D2R);
        if (c == 0) throw new Header.WcsHeaderException("PV2_1", "COD needs theta_a != 0");
        var y0 = R2D * Math.Cos(eta * D2R) * Math.Cos(thetaA * D2R) / c;
        _offset = y0 + thetaA;
        SetConstants("COD", c, y0);
    }

    protected override bool TryRadius(double theta, out double r)
    {
        r = _offset - theta;
        return true;
    }

    protected override bool TryTheta(double r, out double theta)
    {
        theta = _offset - r;
        return true;
    }
}
