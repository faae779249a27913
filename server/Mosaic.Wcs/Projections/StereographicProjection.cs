namespace Mosaic.Wcs.Projections;

/// <summary>STG, Paper II section 5.1.4: R = (360/pi) tan((90 - theta)/2) (eq. 59); the antipode has no image.</summary>
public sealed class StereographicProjection : ZenithalProjection
{
    protected override bool TryRadius(double theta, out double r)
    {
        r = double.NaN;
        if (theta <= -90) return false;
        r = 2 * R2D * Math.Tan((90 - theta) / 2 * D2R);
        return true;
    }

    protected override bool TryTheta(double r, out double theta)
    {
        theta = 90 - 2 * Math.Atan(r / (2 * R2D)) * R2D;   // eq. 60
        return true;
    }
}
