namespace Mosaic.Wcs.Projections;

/// <summary>ARC, Paper II section 5.1.6: R = 90 - theta (eq. 64).</summary>
public sealed class ZenithalEquidistantProjection : ZenithalProjection
{
    protected override bool TryRadius(double theta, out double r)
    {
        r = 90 - theta;
        return true;
    }

    protected override bool TryTheta(double r, out double theta)
    {
        theta = 90 - r;   // eq. 65
        if (r <= 180) return true;
        theta = double.NaN;
        return false;
    }
}
