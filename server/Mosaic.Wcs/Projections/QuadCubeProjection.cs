namespace Mosaic.Wcs.Projections;

/// <summary>
/// The quad-cube projections (Paper II section 5.7): the sphere's six faces laid out as a sideways cross, face 0
/// (the native north pole) above face 1 (centred on the fiducial point), faces 1 to 4 along the equator and face 5
/// below, each face 90 units across. Subclasses map a direction onto its face's square and back.
/// </summary>
public abstract class QuadCubeProjection : Projection
{
    public sealed override double Theta0 => 0;

    /// <summary>Face coordinates (xi, eta) of the direction cosines, divided by the largest, zeta = 1 - ...; in [-1, 1] each.</summary>
    protected abstract bool TryToFace(int face, double xi, double eta, double zeta, double theta, double phi, out double xf, out double yf);

    /// <summary>Direction cosines (along the face normal, and the face's two axes) of face point (xf, yf) in [-1, 1].</summary>
    protected abstract bool TryFromFace(double xf, double yf, out double zeta, out double a, out double b);

    public override bool TryPlaneToNative(double x, double y, out double phi, out double theta)
    {
        phi = theta = double.NaN;
        double xf = x / 45, yf = y / 45;
        if (!double.IsFinite(xf) || !double.IsFinite(yf)) return false;
        // The cross: |x| <= 45 may run from face 0 to face 5; beyond it only the equatorial row exists.
        if (Math.Abs(xf) <= 1) { if (Math.Abs(yf) > 3) return false; }
        else if (Math.Abs(xf) > 7 || Math.Abs(yf) > 1) return false;
        if (xf < -1) xf += 8;
        int face;
        if (xf > 5) { face = 4; xf -= 6; }
        else if (xf > 3) { face = 3; xf -= 4; }
        else if (xf > 1) { face = 2; xf -= 2; }
        else if (yf > 1) { face = 0; yf -= 2; }
        else if (yf < -1) { face = 5; yf += 2; }
        else face = 1;
        if (!TryFromFace(xf, yf, out var zeta, out var a, out var b)) return false;
        return ToNative(face, zeta, a, b, out phi, out theta);
    }

    /// <summary>
    /// Native (phi, theta) of a direction given on a face: zeta along the face normal, (a, b) along the face's x and
    /// y directions (each face's orientation as in Paper II section 5.7).
    /// </summary>
    protected static bool ToNative(int face, double zeta, double a, double b, out double phi, out double theta)
    {
        double l, m, n;
        switch (face)
        {
            case 1: l = zeta; m = a; n = b; break;
            case 2: m = zeta; l = -a; n = b; break;
            case 3: l = -zeta; m = -a; n = b; break;
            case 4: m = -zeta; l = a; n = b; break;
            case 5: n = -zeta; m = a; l = b; break;
            default: n = zeta; m = a; l = -b; break;
        }
        phi = l == 0 && m == 0 ? 0 : Math.Atan2(m, l) * R2D;
        theta = Math.Asin(Math.Clamp(n, -1, 1)) * R2D;
        return InNativeRange(ref phi, ref theta);
    }

    /// <summary>Plane coordinate of face coordinate <paramref name="f"/> on the face whose centre is <paramref name="offset"/> face widths out.</summary>
    protected virtual double Compose(double f, double offset) => 45 * (f + offset);

    public override bool TryNativeToPlane(double phi, double theta, out double x, out double y)
    {
        x = y = double.NaN;
        if (!double.IsFinite(phi) || !(theta is >= -90 and <= 90)) return false;
        var (sinPhi, cosPhi) = SinCosDegrees(phi);
        var (sinTheta, cosTheta) = SinCosDegrees(theta);
        double l = cosTheta * cosPhi, m = cosTheta * sinPhi, n = sinTheta;
        // the face whose normal is nearest the direction.
        int face = 0;
        var zeta = n;
        if (l > zeta) { face = 1; zeta = l; }
        if (m > zeta) { face = 2; zeta = m; }
        if (-l > zeta) { face = 3; zeta = -l; }
        if (-m > zeta) { face = 4; zeta = -m; }
        if (-n > zeta) { face = 5; zeta = -n; }
        double xi, eta, x0, y0;
        switch (face)
        {
            case 1: xi = m; eta = n; x0 = 0; y0 = 0; break;
            case 2: xi = -l; eta = n; x0 = 2; y0 = 0; break;
            case 3: xi = -m; eta = n; x0 = 4; y0 = 0; break;
            case 4: xi = l; eta = n; x0 = 6; y0 = 0; break;
            case 5: xi = m; eta = l; x0 = 0; y0 = -2; break;
            default: xi = m; eta = -l; x0 = 0; y0 = 2; break;
        }
        if (!TryToFace(face, xi, eta, zeta, theta, phi, out var xf, out var yf)) return false;
        x = Compose(xf, x0);
        y = Compose(yf, y0);
        return true;
    }

    /// <summary>Clamps a face coordinate that rounding pushed past the edge; false if it is truly outside.</summary>
    protected static bool OnFace(ref double f, double tolerance)
    {
        if (Math.Abs(f) <= 1) return true;
        if (Math.Abs(f) > 1 + tolerance) return false;
        f = Math.CopySign(1, f);
        return true;
    }
}
