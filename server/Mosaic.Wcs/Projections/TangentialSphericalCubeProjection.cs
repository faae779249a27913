namespace Mosaic.Wcs.Projections;

/// <summary>TSC, Paper II section 5.7.1: the gnomonic projection of the sphere onto each face of the cube.</summary>
public sealed class TangentialSphericalCubeProjection : QuadCubeProjection
{
    protected override bool TryToFace(int face, double xi, double eta, double zeta, double theta, double phi, out double xf, out double yf)
    {
        xf = xi / zeta;
        yf = eta / zeta;
        return OnFace(ref xf, 1e-12) & OnFace(ref yf, 1e-12);
    }

    protected override bool TryFromFace(double xf, double yf, out double zeta, out double a, out double b)
    {
        zeta = 1 / Math.Sqrt(1 + xf * xf + yf * yf);
        a = xf * zeta;
        b = yf * zeta;
        return true;
    }
}
