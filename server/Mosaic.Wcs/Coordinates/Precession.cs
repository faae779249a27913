namespace Mosaic.Wcs.Coordinates;

/// <summary>
/// IAU 1976 precession of the mean equator and equinox (Lieske et al. 1977, A&amp;A 58, 1, eqs. for zeta_A, z_A and
/// theta_A from J2000), the precession the FK5 system is defined with.
/// </summary>
internal static class Precession
{
    /// <summary>Rotation taking mean-of-date vectors at Julian epoch <paramref name="equinox"/> to the J2000 mean equator and equinox.</summary>
    internal static Rotation ToJ2000(double equinox)
    {
        // Julian centuries from J2000 to the equinox; Lieske et al. 1977 with T = 0 (start at J2000).
        var t = (equinox - 2000.0) / 100.0;
        var zeta = ((0.017998 * t + 0.30188) * t + 2306.2181) * t * Angles.ArcsecondsToRadians;
        var z = ((0.018203 * t + 1.09468) * t + 2306.2181) * t * Angles.ArcsecondsToRadians;
        var theta = ((-0.041833 * t - 0.42665) * t + 2004.3109) * t * Angles.ArcsecondsToRadians;
        // J2000 -> date is R3(-z) R2(theta) R3(-zeta) (the order of ERFA's pmat76); its transpose goes back.
        return Rotation.AboutZ(-z).Times(Rotation.AboutY(theta)).Times(Rotation.AboutZ(-zeta)).Transposed();
    }
}
