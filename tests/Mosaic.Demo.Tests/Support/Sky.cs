using Mosaic.Demo.Wcs;

namespace Mosaic.Demo.Tests.Support;

/// <summary>Spherical helpers for assertions.</summary>
internal static class Sky
{
    /// <summary>Great-circle distance by the Vincenty formula (common practice; well conditioned at tiny separations).</summary>
    public static double DistanceArcsec(SkyCoordinate a, double ra, double dec)
    {
        const double deg = Math.PI / 180;
        var (s1, c1) = Math.SinCos(a.DecDegrees * deg);
        var (s2, c2) = Math.SinCos(dec * deg);
        var (sd, cd) = Math.SinCos((ra - a.RaDegrees) * deg);
        var num = Math.Sqrt(Math.Pow(c2 * sd, 2) + Math.Pow(c1 * s2 - s1 * c2 * cd, 2));
        var den = s1 * s2 + c1 * c2 * cd;
        return Math.Atan2(num, den) / deg * 3600;
    }

    /// <summary>Gnomonic (TAN) intermediate coordinates in degrees about a reference point (WCS Paper II, section 5.1.3; formula and section from memory).</summary>
    public static (double Xi, double Eta) Tangent(SkyCoordinate reference, double ra, double dec)
    {
        const double deg = Math.PI / 180;
        var (sd0, cd0) = Math.SinCos(reference.DecDegrees * deg);
        var (sd, cd) = Math.SinCos(dec * deg);
        var (sa, ca) = Math.SinCos((ra - reference.RaDegrees) * deg);
        var cosc = sd * sd0 + cd * cd0 * ca;
        return (cd * sa / cosc / deg, (sd * cd0 - cd * sd0 * ca) / cosc / deg);
    }
}
