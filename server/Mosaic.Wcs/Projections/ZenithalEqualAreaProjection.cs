namespace Mosaic.Wcs.Projections;

/// <summary>ZEA, Paper II section 5.1.8: R = (360/pi) sin((90 - theta)/2) (eq. 68); R &gt; 360/pi has no solution.</summary>
public sealed class ZenithalEqualAreaProjection : ZenithalProjection
{
    protected override bool TryRadius(double theta, out double r)
    {
        r = 2 * R2D * Math.Sin((90 - theta) / 2 * D2R);
        return true;
    }

    protected override bool TryTheta(double r, out double theta)
    {
        var s = r / (2 * R2D);
        theta = double.NaN;
        if (s > 1) return false;
        theta = 90 - 2 * Math.Asin(s) * R2D;   // eq. 70
        return true;
    }
}
