namespace Mosaic.Wcs.Projections;

/// <summary>
/// MOL, Paper II section 5.3.3: x = (2 sqrt2 / pi) phi cos(gamma), y = sqrt2 (180/pi) sin(gamma) with
/// 2 gamma + sin(2 gamma) = pi sin(theta), solved by Newton's method.
/// </summary>
public sealed class MollweideProjection : Projection
{
    private static readonly double Sqrt2 = Math.Sqrt(2);

    public override double Theta0 => 0;

    public override bool TryPlaneToNative(double x, double y, out double phi, out double theta)
    {
        phi = theta = double.NaN;
        var s = y / (Sqrt2 * R2D);
        if (!double.IsFinite(x) || !(Math.Abs(s) <= 1)) return false;
        var gamma = Math.Asin(s);
        var c = Math.Cos(gamma);
        var p = c == 0 ? (x == 0 ? 0 : double.PositiveInfinity) : Math.PI * x / (2 * Sqrt2 * c);
        if (!(Math.Abs(p) <= 180 + 1e-12)) return false;
        phi = p;
        theta = Math.Asin(Math.Clamp((2 * gamma + Math.Sin(2 * gamma)) / Math.PI, -1, 1)) * R2D;
        return true;
    }

    public override bool TryNativeToPlane(double phi, double theta, out double x, out double y)
    {
        x = y = double.NaN;
        if (!(phi is >= -180 and <= 180) || !(theta is >= -90 and <= 90)) return false;
        var gamma = Gamma(theta * D2R);
        x = 2 * Sqrt2 / Math.PI * phi * Math.Cos(gamma);
        y = Sqrt2 * R2D * Math.Sin(gamma);
        return true;
    }

    private static double Gamma(double theta)
    {
        if (Math.Abs(theta) >= Math.PI / 2) return Math.CopySign(Math.PI / 2, theta);
        var target = Math.PI * Math.Sin(theta);
        var g = theta;
        // Newton on 2g + sin 2g = target; its derivative 2 + 2 cos 2g vanishes only at the poles, handled above.
        for (var i = 0; i < 100; i++)
        {
            var step = (2 * g + Math.Sin(2 * g) - target) / (2 + 2 * Math.Cos(2 * g));
            g -= step;
            if (Math.Abs(step) < 1e-15) break;
        }
        return Math.Clamp(g, -Math.PI / 2, Math.PI / 2);
    }
}
