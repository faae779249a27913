using Mosaic.Wcs.Header;
using FitsHeader = Mosaic.Fits.Header;

namespace Mosaic.Wcs.Distortion;

/// <summary>
/// SIP distortion (Shupe et al. 2005): pixel offsets (u, v) from CRPIX become (u + f(u, v), v + g(u, v)) with
/// f = A_p_q and g = B_p_q before the CD matrix. The inverse starts from AP/BP when present and is refined by
/// Newton's method on the forward polynomials to 1e-8 px, so it is exact whatever the fit quality of AP/BP.
/// </summary>
public sealed class SipDistortion
{
    private const double Tolerance = 1e-10;
    private const int MaxIterations = 50;
    private readonly SipPolynomial _a, _b;
    private readonly SipPolynomial? _ap, _bp;

    public SipDistortion(SipPolynomial a, SipPolynomial b, SipPolynomial? ap, SipPolynomial? bp)
    {
        _a = a; _b = b; _ap = ap; _bp = bp;
    }

    public bool HasInverseCoefficients => _ap is not null && _bp is not null;

    /// <summary>The SIP terms of a header whose CTYPE1/2 end in "-SIP".</summary>
    /// <exception cref="WcsHeaderException">A_ORDER or B_ORDER is missing, or a term is malformed.</exception>
    public static SipDistortion From(FitsHeader header)
    {
        ArgumentNullException.ThrowIfNull(header);
        var a = SipPolynomial.From(header, "A") ?? throw new WcsHeaderException("A_ORDER", "is missing for a -SIP axis type");
        var b = SipPolynomial.From(header, "B") ?? throw new WcsHeaderException("B_ORDER", "is missing for a -SIP axis type");
        return new SipDistortion(a, b, SipPolynomial.From(header, "AP"), SipPolynomial.From(header, "BP"));
    }

    public (double U, double V) Forward(double u, double v) => (u + _a.Evaluate(u, v), v + _b.Evaluate(u, v));

    /// <summary>The offsets (u, v) whose distorted image is (uu, vv); false if Newton's method does not converge.</summary>
    public bool TryInverse(double uu, double vv, out double u, out double v)
    {
        if (HasInverseCoefficients) { u = uu + _ap!.Evaluate(uu, vv); v = vv + _bp!.Evaluate(uu, vv); }
        else { u = uu; v = vv; }
        for (var i = 0; i < MaxIterations; i++)
        {
            var (f, fu, fv) = _a.EvaluateWithGradient(u, v);
            var (g, gu, gv) = _b.EvaluateWithGradient(u, v);
            double r1 = u + f - uu, r2 = v + g - vv;
            double j11 = 1 + fu, j12 = fv, j21 = gu, j22 = 1 + gv;
            var det = j11 * j22 - j12 * j21;
            if (det == 0 || !double.IsFinite(det)) break;
            var du = (j22 * r1 - j12 * r2) / det;
            var dv = (j11 * r2 - j21 * r1) / det;
            u -= du; v -= dv;
            if (Math.Abs(du) < Tolerance && Math.Abs(dv) < Tolerance) return true;
        }
        u = v = double.NaN;
        return false;
    }
}
