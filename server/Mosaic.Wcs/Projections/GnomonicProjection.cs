namespace Mosaic.Wcs.Projections;

/// <summary>TAN, Paper II section 5.1.3: R = (180/pi) cot theta (eq. 54); only theta &gt; 0 has an image.</summary>
public sealed class GnomonicProjection : ZenithalProjection
{
    protected override bool TryRadius(double theta, out double r)
    {
        r = double.NaN;
        if (theta <= 0) return false;
        var t = theta * D2R;
        r = R2D * Math.Cos(t) / Math.Sin(t);
        return true;
    }

    protected override bool TryTheta(double r, out double theta)
    {
        theta = Math.Atan2(R2D, r) * R2D;   // eq. 55
        return true;
    }
}
