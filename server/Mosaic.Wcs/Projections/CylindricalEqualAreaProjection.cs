namespace Mosaic.Wcs.Projections;

/// <summary>CEA, Paper II section 5.2.2: x = phi, y = (180/pi) sin(theta) / lambda (eqs. 80-81), lambda = PV2_1 in (0, 1].</summary>
public sealed class CylindricalEqualAreaProjection : Projection
{
    private readonly double _lambda;

    /// <exception cref="Header.WcsHeaderException">PV2_1 is outside (0, 1].</exception>
    public CylindricalEqualAreaProjection(double lambda)
    {
        if (!(lambda is > 0 and <= 1)) throw new Header.WcsHeaderException("PV2_1", $"CEA needs 0 < lambda <= 1, got {lambda}");
        _lambda = lambda;
    }

    public override double Theta0 => 0;

    public override bool TryPlaneToNative(double x, double y, out double phi, out double theta)
    {
        var s = _lambda * y * D2R;
        phi = x; theta = double.NaN;
        if (!double.IsFinite(x) || !(Math.Abs(s) <= 1)) { phi = double.NaN; return false; }
        theta = Math.Asin(s) * R2D;   // eq. 83
        return true;
    }

    public override bool TryNativeToPlane(double phi, double theta, out double x, out double y)
    {
        x = phi; y = R2D * Math.Sin(theta * D2R) / _lambda;
        if (double.IsFinite(phi) && theta is >= -90 and <= 90) return true;
        x = y = double.NaN;
        return false;
    }
}
