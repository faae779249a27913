namespace Mosaic.Wcs.Projections;

/// <summary>
/// CSC, Paper II section 5.7.2: the cube of Chan &amp; O'Neill (1975) whose forward and inverse maps are the
/// published polynomial fits (with their coefficients). The fits were made for single
/// precision and are evaluated in it, as wcslib does, so results match it; the two fits are not exact inverses of
/// each other, so a round trip moves a point by up to the fits' own error.
/// </summary>
public sealed class CobeSphericalCubeProjection : QuadCubeProjection
{
    // Forward (sphere -> face) coefficients.
    private const float GStar = 1.37484847732f, Mm = 0.004869491981f, Gamma = -0.13161671474f, Omega1 = -0.159596235474f;
    private const float D0 = 0.0759196200467f, D1 = -0.0217762490699f;
    private const float C00 = 0.141189631152f, C10 = 0.0809701286525f, C01 = -0.281528535557f;
    private const float C11 = 0.15384112876f, C20 = -0.178251207466f, C02 = 0.106959469314f;

    // Inverse (face -> sphere) coefficients P_ij.
    private const float P00 = -0.27292696f, P10 = -0.07629969f, P20 = -0.22797056f, P30 = 0.54852384f, P40 = -0.62930065f, P50 = 0.25795794f, P60 = 0.02584375f;
    private const float P01 = -0.02819452f, P11 = -0.01471565f, P21 = 0.48051509f, P31 = -1.74114454f, P41 = 1.71547508f, P51 = -0.53022337f;
    private const float P02 = 0.27058160f, P12 = -0.56800938f, P22 = 0.30803317f, P32 = 0.98938102f, P42 = -0.83180469f;
    private const float P03 = -0.60441560f, P13 = 1.50880086f, P23 = -0.93678576f, P33 = 0.08693841f;
    private const float P04 = 0.93412077f, P14 = -1.41601920f, P24 = 0.33887446f;
    private const float P05 = -0.63915306f, P15 = 0.52032238f;
    private const float P06 = 0.14381585f;

    private const double Inverse45 = 1.0 / 45.0;

    protected override bool TryToFace(int face, double xi, double eta, double zeta, double theta, double phi, out double xf, out double yf)
    {
        var chi = (float)(xi / zeta);
        var psi = (float)(eta / zeta);
        float chi2 = chi * chi, psi2 = psi * psi;
        float chi2co = 1.0f - chi2, psi2co = 1.0f - psi2;
        // Products too small for single precision are dropped rather than underflowing.
        var chipsi = MathF.Abs(chi * psi);
        var chi4 = chi2 > 1.0e-16f ? chi2 * chi2 : 0.0f;
        var psi4 = psi2 > 1.0e-16f ? psi2 * psi2 : 0.0f;
        var chi2psi2 = chipsi > 1.0e-16f ? chi2 * psi2 : 0.0f;
        var fx = chi * (chi2 + chi2co * (GStar + psi2 * (Gamma * chi2co + Mm * chi2 +
            psi2co * (C00 + C10 * chi2 + C01 * psi2 + C11 * chi2psi2 + C20 * chi4 + C02 * psi4)) + chi2 * (Omega1 - chi2co * (D0 + D1 * chi2))));
        var fy = psi * (psi2 + psi2co * (GStar + chi2 * (Gamma * psi2co + Mm * psi2 +
            chi2co * (C00 + C10 * psi2 + C01 * chi2 + C11 * chi2psi2 + C20 * psi4 + C02 * chi4)) + psi2 * (Omega1 - psi2co * (D0 + D1 * psi2))));
        xf = fx;
        yf = fy;
        return OnFace(ref xf, 1e-7) & OnFace(ref yf, 1e-7);
    }

    /// <summary>The face offset is added in single precision too.</summary>
    protected override double Compose(double f, double offset) => 45.0 * (double)((float)f + (float)offset);

    public override bool TryPlaneToNative(double x, double y, out double phi, out double theta)
    {
        phi = theta = double.NaN;
        var xf = (float)(x * Inverse45);
        var yf = (float)(y * Inverse45);
        if (!float.IsFinite(xf) || !float.IsFinite(yf)) return false;
        if (MathF.Abs(xf) <= 1) { if (MathF.Abs(yf) > 3) return false; }
        else if (MathF.Abs(xf) > 7 || MathF.Abs(yf) > 1) return false;
        if (xf < -1.0f) xf += 8.0f;
        int face;
        if (xf > 5.0f) { face = 4; xf -= 6.0f; }
        else if (xf > 3.0f) { face = 3; xf -= 4.0f; }
        else if (xf > 1.0f) { face = 2; xf -= 2.0f; }
        else if (yf > 1.0f) { face = 0; yf -= 2.0f; }
        else if (yf < -1.0f) { face = 5; yf += 2.0f; }
        else face = 1;
        TryFromFace(xf, yf, out var zeta, out var a, out var b);
        return ToNative(face, zeta, a, b, out phi, out theta);
    }

    protected override bool TryFromFace(double xfd, double yfd, out double zeta, out double a, out double b)
    {
        float xf = (float)xfd, yf = (float)yfd;
        float xx = xf * xf, yy = yf * yf;
        var chi = Series(xx, yy);
        chi = xf + xf * (1.0f - xx) * chi;
        var psi = Series(yy, xx);
        psi = yf + yf * (1.0f - yy) * psi;
        var t = 1.0 / Math.Sqrt((double)(chi * chi + psi * psi) + 1.0);
        zeta = t;
        a = chi * t;
        b = psi * t;
        return true;
    }

    /// <summary>sum_ij P_ij u^i v^j for the inverse fit, nested in v over polynomials in u.</summary>
    private static float Series(float u, float v)
    {
        var z0 = P00 + u * (P10 + u * (P20 + u * (P30 + u * (P40 + u * (P50 + u * P60)))));
        var z1 = P01 + u * (P11 + u * (P21 + u * (P31 + u * (P41 + u * P51))));
        var z2 = P02 + u * (P12 + u * (P22 + u * (P32 + u * P42)));
        var z3 = P03 + u * (P13 + u * (P23 + u * P33));
        var z4 = P04 + u * (P14 + u * P24);
        var z5 = P05 + u * P15;
        var z6 = P06;
        return z0 + v * (z1 + v * (z2 + v * (z3 + v * (z4 + v * (z5 + v * z6)))));
    }
}
