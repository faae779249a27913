using System.Numerics;

namespace Mosaic.Demo.Rendering;

/// <summary>
/// Renders one Sérsic galaxy, I(r) = Ie exp(−b_n ((r/re)^(1/n) − 1)), into a stamp, supersamples its centre, blurs
/// it with a Gaussian of the band's seeing FWHM (separable) and adds it to the chip. Holds its scratch buffers, so one
/// instance per worker.
/// </summary>
internal sealed class GalaxyStamp
{
    private const int MaxRadius = 300;
    private const int CentreSubsamples = 5;

    private float[] _profile = [];
    private float[] _pass = [];
    private float[] _row = [];

    /// <param name="majorAxisAngle">Major axis in the chip's pixel frame, radians counter-clockwise from +x.</param>
    public void Add(Span<float> image, int width, int height, double cx, double cy, double flux, double n, double re,
        double axisRatio, double majorAxisAngle, double psfFwhm)
    {
        var b = SersicB(n);
        var ie = flux / TotalFluxPerUnitIe(n, re, axisRatio);
        var truncation = n >= 2 ? 8.0 : 5.0;
        var radius = (int)Math.Ceiling(Math.Clamp(truncation * re, 3, MaxRadius));
        var ix = (int)Math.Round(cx);
        var iy = (int)Math.Round(cy);
        if (ix + radius < 0 || ix - radius >= width || iy + radius < 0 || iy - radius >= height) return;

        var sigma = psfFwhm / (2 * Math.Sqrt(2 * Math.Log(2)));
        var kr = (int)Math.Ceiling(3 * sigma);
        Span<float> kernel = stackalloc float[2 * kr + 1];
        double ksum = 0;
        for (var k = -kr; k <= kr; k++) ksum += kernel[k + kr] = (float)Math.Exp(-k * k / (2 * sigma * sigma));
        for (var k = 0; k < kernel.Length; k++) kernel[k] = (float)(kernel[k] / ksum);

        var size = 2 * radius + 1;
        var big = size + 2 * kr;
        Ensure(ref _profile, big * big);
        Ensure(ref _pass, big * size);
        Ensure(ref _row, size);
        var profile = _profile.AsSpan(0, big * big);
        var left = ix - radius - kr;
        var bottom = iy - radius - kr;
        FillProfile(profile, big, left - cx, bottom - cy, ie, b, n, re, axisRatio, majorAxisAngle);
        SupersampleCentre(profile, big, left, bottom, cx, cy, ie, b, n, re, axisRatio, majorAxisAngle);

        var pass = _pass.AsSpan(0, big * size);
        pass.Clear();
        for (var j = 0; j < big; j++)
        {
            var destination = pass.Slice(j * size, size);
            for (var k = 0; k < kernel.Length; k++)
                SpanMath.AddScaled(profile.Slice(j * big + k, size), kernel[k], destination);
        }

        var row = _row.AsSpan(0, size);
        var xs = Math.Max(0, ix - radius);
        var xe = Math.Min(width - 1, ix + radius);
        for (var j = 0; j < size; j++)
        {
            var y = iy - radius + j;
            if (y < 0 || y >= height) continue;
            row.Clear();
            for (var k = 0; k < kernel.Length; k++) SpanMath.AddScaled(pass.Slice((j + k) * size, size), kernel[k], row);
            SpanMath.Add(row.Slice(xs - (ix - radius), xe - xs + 1), image.Slice(y * width + xs, xe - xs + 1));
        }
    }

    /// <summary>b_n from the asymptotic series of Ciotti &amp; Bertin (1999), accurate far below 10⁻⁴ for n ≥ 0.5.</summary>
    internal static double SersicB(double n) =>
        2 * n - 1.0 / 3 + 4 / (405 * n) + 46 / (25515 * n * n) + 131 / (1148175 * n * n * n);

    /// <summary>
    /// Total flux of an elliptical Sérsic profile per unit Ie: 2π q n re² e^b b^(−2n) Γ(2n) (Graham &amp; Driver 2005;
    /// from memory, and checked against direct integration by the tests).
    /// </summary>
    internal static double TotalFluxPerUnitIe(double n, double re, double axisRatio)
    {
        var b = SersicB(n);
        return 2 * Math.PI * axisRatio * n * re * re * Math.Exp(b) * Math.Pow(b, -2 * n) * GammaOfTwiceN(n);
    }

    private static double GammaOfTwiceN(double n)
    {
        var m = 2 * n;
        if (m < 1 || m > 20 || Math.Abs(m - Math.Round(m)) > 1e-12)
            throw new ArgumentOutOfRangeException(nameof(n), n, "The Sérsic index must be a multiple of 0.5 in [0.5, 10].");
        double gamma = 1;
        for (var k = 2; k < (int)Math.Round(m); k++) gamma *= k;
        return gamma;
    }

    private static void FillProfile(Span<float> profile, int big, double dx0, double dy0, double ie, double b, double n,
        double re, double q, double angle)
    {
        var (sin, cos) = Math.SinCos(angle);
        var vn = Vector<float>.Count;
        var vCos = new Vector<float>((float)cos);
        var vSin = new Vector<float>((float)sin);
        var vInvQ = new Vector<float>((float)(1 / q));
        var vInvRe = new Vector<float>((float)(1 / re));
        var vInvN = new Vector<float>((float)(1 / n));
        var vMinusB = new Vector<float>((float)-b);
        var vPeak = new Vector<float>((float)(ie * Math.Exp(b)));
        for (var j = 0; j < big; j++)
        {
            var row = profile.Slice(j * big, big);
            var dy = (float)(dy0 + j);
            var vDy = new Vector<float>(dy);
            var i = 0;
            for (; i <= big - vn; i += vn)
            {
                var dx = new Vector<float>((float)(dx0 + i)) + Vector<float>.Indices;
                var major = dx * vCos + vDy * vSin;
                var minor = (vDy * vCos - dx * vSin) * vInvQ;
                var r = Vector.SquareRoot(major * major + minor * minor) * vInvRe;
                var value = vPeak * Vector.Exp(vMinusB * Vector.Exp(Vector.Log(r) * vInvN));
                value.CopyTo(row[i..]);
            }
            for (; i < big; i++)
                row[i] = (float)Sersic(dx0 + i, dy, ie, b, n, re, q, sin, cos);
        }
    }

    /// <summary>The steep centre of an n = 4 profile is badly sampled at one point per pixel: average a sub-grid there.</summary>
    private static void SupersampleCentre(Span<float> profile, int big, int left, int bottom, double cx, double cy,
        double ie, double b, double n, double re, double q, double angle)
    {
        var (sin, cos) = Math.SinCos(angle);
        var ix = (int)Math.Round(cx);
        var iy = (int)Math.Round(cy);
        for (var y = iy - 2; y <= iy + 2; y++)
        for (var x = ix - 2; x <= ix + 2; x++)
        {
            var i = x - left;
            var j = y - bottom;
            if (i < 0 || j < 0 || i >= big || j >= big) continue;
            double sum = 0;
            for (var sy = 0; sy < CentreSubsamples; sy++)
            for (var sx = 0; sx < CentreSubsamples; sx++)
            {
                var dx = x - cx + (sx + 0.5) / CentreSubsamples - 0.5;
                var dy = y - cy + (sy + 0.5) / CentreSubsamples - 0.5;
                sum += Sersic(dx, dy, ie, b, n, re, q, sin, cos);
            }
            profile[j * big + i] = (float)(sum / (CentreSubsamples * CentreSubsamples));
        }
    }

    private static double Sersic(double dx, double dy, double ie, double b, double n, double re, double q, double sin, double cos)
    {
        var major = dx * cos + dy * sin;
        var minor = (dy * cos - dx * sin) / q;
        var r = Math.Sqrt(major * major + minor * minor) / re;
        return ie * Math.Exp(-b * (Math.Pow(r, 1 / n) - 1));
    }

    private static void Ensure(ref float[] buffer, int length)
    {
        if (buffer.Length < length) buffer = new float[length];
    }
}
