namespace Mosaic.Wcs.Projections;

/// <summary>
/// QSC, Paper II section 5.7.3: the equal-area quadrilateralized spherical cube, each face split
/// into four triangles about its centre; exact in both directions.
/// </summary>
public sealed class QuadrilateralizedSphericalCubeProjection : QuadCubeProjection
{
    private const double Tolerance = 1e-12;
    private static readonly double InvSqrt2 = 1 / Math.Sqrt(2);

    protected override bool TryToFace(int face, double xi, double eta, double zeta, double theta, double phi, out double xf, out double yf)
    {
        xf = yf = 0;
        if (Math.Abs(theta) == 90)
        {
            // The poles sit at the centres of faces 0 and 5.
            return true;
        }
        var zeco = 1 - zeta;
        if (zeco < 1e-8)
        {
            // Near a face centre 1 - zeta loses its digits: the small-angle form from the native angles.
            double t = theta * D2R, p = Math.Atan2(Math.Sin(phi * D2R), Math.Cos(phi * D2R));
            zeco = face switch
            {
                1 => (p * p + t * t) / 2,
                2 => Square(p - Math.PI / 2, t),
                3 => Square(p - Math.CopySign(Math.PI, p), t),
                4 => Square(p + Math.PI / 2, t),
                5 => Math.Pow((theta + 90) * D2R, 2) / 2,
                _ => Math.Pow((90 - theta) * D2R, 2) / 2,
            };
        }
        if (xi != 0 || eta != 0)
        {
            // which of the face's four triangles, then the equal-area stretch along and across it.
            if (-xi > Math.Abs(eta)) { var o = eta / xi; xf = -Radial(zeco, o); yf = Across(xf, o); }
            else if (xi > Math.Abs(eta)) { var o = eta / xi; xf = Radial(zeco, o); yf = Across(xf, o); }
            else if (-eta >= Math.Abs(xi)) { var o = xi / eta; yf = -Radial(zeco, o); xf = Across(yf, o); }
            else if (eta >= Math.Abs(xi)) { var o = xi / eta; yf = Radial(zeco, o); xf = Across(yf, o); }
        }
        return OnFace(ref xf, Tolerance) & OnFace(ref yf, Tolerance);
    }

    private static double Square(double p, double t) => (p * p + t * t) / 2;

    private static double Radial(double zeco, double omega)
    {
        var tau = 1 + omega * omega;
        return Math.Sqrt(zeco / (1 - 1 / Math.Sqrt(1 + tau)));
    }

    private static double Across(double along, double omega)
    {
        var tau = 1 + omega * omega;
        return along / 15 * (Math.Atan(omega) * R2D - Math.Asin(omega / Math.Sqrt(tau + tau)) * R2D);
    }

    protected override bool TryFromFace(double xf, double yf, out double zeta, out double a, out double b)
    {
        var direct = Math.Abs(xf) > Math.Abs(yf);
        double omega, tau, zeco;
        var along = direct ? xf : yf;
        var across = direct ? yf : xf;
        if (along == 0) { omega = 0; tau = 1; zeco = 0; }
        else
        {
            var (s, c) = SinCosDegrees(15 * across / along);
            omega = s / (c - InvSqrt2);
            tau = 1 + omega * omega;
            zeco = along * along * (1 - 1 / Math.Sqrt(1 + tau));
        }
        zeta = 1 - zeco;
        double w;
        if (zeta < -1)
        {
            a = b = double.NaN;
            if (zeta < -1 - Tolerance) return false;
            zeta = -1; w = 0;
        }
        else w = Math.Sqrt(zeco * (2 - zeco) / tau);
        // w is the component along the dominant face axis, w * omega the other, both signed by the face coordinates.
        var major = along < 0 ? -w : w;
        var minor = major * omega;
        (a, b) = direct ? (major, minor) : (minor, major);
        return true;
    }
}
