using Mosaic.Demo.Numerics;

namespace Mosaic.Demo.Wcs;

/// <summary>
/// Fits the inverse SIP polynomials AP, BP to a forward A, B over one chip by least squares on a grid (the usual way
/// inverse SIP terms are produced, Shupe et al. 2005), and reports the worst residual on a finer, offset grid.
/// </summary>
internal static class SipInverseFit
{
    public readonly record struct Result(SipPolynomial Ap, SipPolynomial Bp, double MaxResidualPixels);

    /// <param name="uMin">Domain in pixel offsets from CRPIX, before distortion.</param>
    public static Result Fit(SipPolynomial a, SipPolynomial b, int order, double uMin, double uMax, double vMin, double vMax)
    {
        const int samplesPerSide = 40;
        var nu = samplesPerSide;
        var nv = samplesPerSide;
        var terms = (order + 1) * (order + 2) / 2;
        var scale = Math.Max(Math.Max(Math.Abs(uMin), Math.Abs(uMax)), Math.Max(Math.Abs(vMin), Math.Abs(vMax)));
        scale = Math.Max(scale, 1.0);

        var design = new double[nu * nv, terms];
        var du = new double[nu * nv];
        var dv = new double[nu * nv];
        Span<double> up = stackalloc double[order + 1];
        Span<double> vp = stackalloc double[order + 1];
        var row = 0;
        for (var i = 0; i < nu; i++)
        for (var j = 0; j < nv; j++)
        {
            var u = uMin + (uMax - uMin) * i / (nu - 1);
            var v = vMin + (vMax - vMin) * j / (nv - 1);
            var uu = u + a.Evaluate(u, v);
            var vv = v + b.Evaluate(u, v);
            Powers(uu / scale, up);
            Powers(vv / scale, vp);
            var t = 0;
            for (var p = 0; p <= order; p++)
            for (var q = 0; q <= order - p; q++)
                design[row, t++] = up[p] * vp[q];
            du[row] = u - uu;
            dv[row] = v - vv;
            row++;
        }

        var ap = ToPolynomial(LeastSquares.Solve(design, du), order, scale);
        var bp = ToPolynomial(LeastSquares.Solve(design, dv), order, scale);

        double worst = 0;
        const int checks = 97;
        for (var i = 0; i < checks; i++)
        for (var j = 0; j < checks; j++)
        {
            var u = uMin + (uMax - uMin) * i / (checks - 1);
            var v = vMin + (vMax - vMin) * j / (checks - 1);
            var uu = u + a.Evaluate(u, v);
            var vv = v + b.Evaluate(u, v);
            var ru = uu + ap.Evaluate(uu, vv) - u;
            var rv = vv + bp.Evaluate(uu, vv) - v;
            worst = Math.Max(worst, Math.Sqrt(ru * ru + rv * rv));
        }
        return new Result(ap, bp, worst);
    }

    private static void Powers(double x, Span<double> powers)
    {
        powers[0] = 1;
        for (var i = 1; i < powers.Length; i++) powers[i] = powers[i - 1] * x;
    }

    private static SipPolynomial ToPolynomial(double[] solution, int order, double scale)
    {
        var c = new double[order + 1, order + 1];
        var t = 0;
        for (var p = 0; p <= order; p++)
        for (var q = 0; q <= order - p; q++)
            c[p, q] = solution[t++] / Math.Pow(scale, p + q);
        return new SipPolynomial(order, c);
    }
}
