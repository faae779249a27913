namespace Mosaic.Demo.Wcs;

/// <summary>
/// A celestial TAN projection with SIP distortion, as written into each chip header: pixel → SIP (A, B) → CD → TAN
/// (WCS Papers I and II; Shupe et al. 2005). Sky → pixel solves the forward SIP exactly by Newton iteration,
/// starting from the fitted inverse (AP, BP), so drawn positions do not inherit the inverse fit's residual.
/// </summary>
public sealed class TanSipWcs
{
    private const int MaxNewtonIterations = 30;

    private readonly double _inv11, _inv12, _inv21, _inv22;

    /// <param name="referencePixel1">CRPIX1, 1-based as in the header.</param>
    /// <param name="referencePixel2">CRPIX2, 1-based as in the header.</param>
    public TanSipWcs(SkyCoordinate referenceValue, double referencePixel1, double referencePixel2,
        double cd11, double cd12, double cd21, double cd22,
        SipPolynomial a, SipPolynomial b, SipPolynomial ap, SipPolynomial bp)
    {
        var det = cd11 * cd22 - cd12 * cd21;
        if (!double.IsFinite(det) || det == 0) throw new ArgumentException("The CD matrix is singular.");
        ReferenceValue = referenceValue;
        ReferencePixel1 = referencePixel1;
        ReferencePixel2 = referencePixel2;
        Cd11 = cd11; Cd12 = cd12; Cd21 = cd21; Cd22 = cd22;
        _inv11 = cd22 / det; _inv12 = -cd12 / det; _inv21 = -cd21 / det; _inv22 = cd11 / det;
        A = a; B = b; Ap = ap; Bp = bp;
    }

    public SkyCoordinate ReferenceValue { get; }
    public double ReferencePixel1 { get; }
    public double ReferencePixel2 { get; }
    public double Cd11 { get; }
    public double Cd12 { get; }
    public double Cd21 { get; }
    public double Cd22 { get; }
    public SipPolynomial A { get; }
    public SipPolynomial B { get; }
    public SipPolynomial Ap { get; }
    public SipPolynomial Bp { get; }

    public SkyCoordinate PixelToSky(PixelPosition pixel)
    {
        var u = pixel.X + 1 - ReferencePixel1;
        var v = pixel.Y + 1 - ReferencePixel2;
        var uu = u + A.Evaluate(u, v);
        var vv = v + B.Evaluate(u, v);
        return Gnomonic.ToSky(ReferenceValue, Cd11 * uu + Cd12 * vv, Cd21 * uu + Cd22 * vv);
    }

    /// <summary>CD⁻¹ applied to intermediate world coordinates (degrees): the undistorted pixel offset it corresponds to.</summary>
    internal (double U, double V) LinearInverse(double xiDegrees, double etaDegrees) =>
        (_inv11 * xiDegrees + _inv12 * etaDegrees, _inv21 * xiDegrees + _inv22 * etaDegrees);

    /// <summary>The 0-based pixel of a sky position; NaN where the position is 90° or more from CRVAL.</summary>
    public PixelPosition SkyToPixel(SkyCoordinate sky)
    {
        if (!Gnomonic.TryToPlane(ReferenceValue, sky, out var xi, out var eta)) return new PixelPosition(double.NaN, double.NaN);
        var uu = _inv11 * xi + _inv12 * eta;
        var vv = _inv21 * xi + _inv22 * eta;
        var u = uu + Ap.Evaluate(uu, vv);
        var v = vv + Bp.Evaluate(uu, vv);
        for (var i = 0; i < MaxNewtonIterations; i++)
        {
            var f = u + A.Evaluate(u, v, out var fu, out var fv) - uu;
            var g = v + B.Evaluate(u, v, out var gu, out var gv) - vv;
            var j11 = 1 + fu; var j12 = fv; var j21 = gu; var j22 = 1 + gv;
            var det = j11 * j22 - j12 * j21;
            var du = (f * j22 - g * j12) / det;
            var dv = (g * j11 - f * j21) / det;
            u -= du;
            v -= dv;
            if (Math.Abs(du) + Math.Abs(dv) < 1e-11) break;
        }
        return new PixelPosition(u + ReferencePixel1 - 1, v + ReferencePixel2 - 1);
    }
}
