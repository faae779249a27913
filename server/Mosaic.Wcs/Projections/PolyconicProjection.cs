namespace Mosaic.Wcs.Projections;

/// <summary>
/// PCO, Paper II section 5.6.2: x = (180/pi) cot(theta) sin(phi sin theta), y = theta + (180/pi) cot(theta)
/// (1 - cos(phi sin theta)), x = phi on the equator. The inverse solves
/// x^2 + (y - theta)(y - theta - 2 (180/pi) cot theta) = 0 for theta between 0 and y by bisection.
/// </summary>
public sealed class PolyconicProjection : Projection
{
    private const double Tolerance = 1e-12;

    public override double Theta0 => 0;

    public override bool TryPlaneToNative(double x, double y, out double phi, out double theta)
    {
        phi = theta = double.NaN;
        if (!double.IsFinite(x) || !double.IsFinite(y)) return false;
        var w = Math.Abs(y);
        if (w < Tolerance) { phi = x; theta = 0; }
        else if (Math.Abs(w - 90) < Tolerance) { phi = 0; theta = Math.CopySign(90, y); }
        else
        {
            theta = SolveTheta(x, y);
            var tan = Math.Tan(theta * D2R);
            double x1 = R2D - (y - theta) * tan, y1 = x * tan;
            phi = x1 == 0 && y1 == 0 ? 0 : Math.Atan2(y1, x1) * R2D / Math.Sin(theta * D2R);
        }
        return InNativeRange(ref phi, ref theta, Tolerance);
    }

    public override bool TryNativeToPlane(double phi, double theta, out double x, out double y)
    {
        x = y = double.NaN;
        if (!(phi is >= -180 and <= 180) || !(theta is >= -90 and <= 90)) return false;
        var (sinTheta, cosTheta) = SinCosDegrees(theta);
        if (sinTheta == 0) { x = phi; y = 0; return true; }
        var a = phi * sinTheta * D2R;
        // cot(theta) (1 - cos a) written as cos(theta) 2 sin^2(a/2) / sin(theta) keeps its digits near the equator.
        var half = Math.Sin(a / 2);
        x = R2D * cosTheta * Math.Sin(a) / sinTheta;
        y = theta + R2D * cosTheta * 2 * half * half / sinTheta;
        return true;
    }

    /// <summary>
    /// The root of f(theta) = x^2 + (y - theta)(y - theta - 2 (180/pi) cot theta) between 0 and y (or the pole on
    /// y's side when |y| &gt; 90): f tends to minus infinity next to 0 and is x^2 at y, x^2 + (y -/+ 90)^2 at a pole.
    /// </summary>
    private static double SolveTheta(double x, double y)
    {
        double lo = 0, hi = Math.CopySign(Math.Min(Math.Abs(y), 90), y);   // f < 0 at the lo end, f >= 0 at the hi end
        var xx = x * x;
        for (var k = 0; k < 200; k++)
        {
            var mid = 0.5 * (lo + hi);
            if (mid == lo || mid == hi) break;
            var d = y - mid;
            var f = xx + d * (d - 2 * R2D / Math.Tan(mid * D2R));
            if (f > 0) hi = mid; else lo = mid;
        }
        return 0.5 * (lo + hi);
    }
}
