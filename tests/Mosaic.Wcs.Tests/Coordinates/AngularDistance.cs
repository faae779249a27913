namespace Mosaic.Wcs.Tests.Coordinates;

/// <summary>Great-circle separation, so RA differences near the poles and across 0/360 are judged fairly.</summary>
internal static class AngularDistance
{
    /// <summary>Separation in milliarcseconds by the Vincenty formula (common practice: stable at all distances).</summary>
    internal static double Milliarcseconds(double lon1, double lat1, double lon2, double lat2)
    {
        const double rad = Math.PI / 180.0;
        var dLon = (lon2 - lon1) * rad;
        var (s1, c1) = Math.SinCos(lat1 * rad);
        var (s2, c2) = Math.SinCos(lat2 * rad);
        var (sd, cd) = Math.SinCos(dLon);
        var num = Math.Sqrt(Math.Pow(c2 * sd, 2) + Math.Pow(c1 * s2 - s1 * c2 * cd, 2));
        var den = s1 * s2 + c1 * c2 * cd;
        return Math.Atan2(num, den) / rad * 3600_000.0;
    }
}
