namespace Mosaic.Demo.Wcs;

/// <summary>
/// The TAN (gnomonic) projection of WCS Paper II (Calabretta &amp; Greisen 2002, section 5.1.3) with the reference point
/// at the native pole and LONPOLE = 180°, written as the equivalent direct formulas between (α, δ) and the
/// intermediate world coordinates (ξ, η) in degrees.
/// </summary>
internal static class Gnomonic
{
    private const double Deg = Math.PI / 180.0;

    public static SkyCoordinate ToSky(SkyCoordinate reference, double xiDegrees, double etaDegrees)
    {
        var x = xiDegrees * Deg;
        var y = etaDegrees * Deg;
        var (sd0, cd0) = Math.SinCos(reference.DecDegrees * Deg);
        var denominator = cd0 - y * sd0;
        var ra = reference.RaDegrees + Math.Atan2(x, denominator) / Deg;
        var dec = Math.Atan2(sd0 + y * cd0, Math.Sqrt(x * x + denominator * denominator)) / Deg;
        ra %= 360.0;
        if (ra < 0) ra += 360.0;
        return new SkyCoordinate(ra, dec);
    }

    /// <summary>False for a point 90° or more from the reference, which the projection cannot show.</summary>
    public static bool TryToPlane(SkyCoordinate reference, SkyCoordinate sky, out double xiDegrees, out double etaDegrees)
    {
        var (sd0, cd0) = Math.SinCos(reference.DecDegrees * Deg);
        var (sd, cd) = Math.SinCos(sky.DecDegrees * Deg);
        var (sa, ca) = Math.SinCos((sky.RaDegrees - reference.RaDegrees) * Deg);
        var cosDistance = sd * sd0 + cd * cd0 * ca;
        if (cosDistance <= 1e-12)
        {
            xiDegrees = etaDegrees = double.NaN;
            return false;
        }
        xiDegrees = cd * sa / cosDistance / Deg;
        etaDegrees = (sd * cd0 - cd * sd0 * ca) / cosDistance / Deg;
        return true;
    }
}
