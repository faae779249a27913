namespace Mosaic.Wcs.Coordinates;

/// <summary>
/// The small fixed rotation between ICRS and the FK5 J2000 mean equator and equinox, with the offsets of the FK5
/// pole and origin in ICRS given in USNO Circular 179 (Kaplan 2005) §3.5: η0 = −19.9 mas, ξ0 = 9.1 mas,
/// dα0 = −22.9 mas. These are the values astropy's ICRS ↔ FK5 transform uses, so positions agree with it.
/// </summary>
public static class FrameBias
{
    private const double Eta0 = -19.9e-3 * Angles.ArcsecondsToRadians;
    private const double Xi0 = 9.1e-3 * Angles.ArcsecondsToRadians;
    private const double DeltaRa0 = -22.9e-3 * Angles.ArcsecondsToRadians;

    internal static readonly Rotation IcrsToFk5Matrix =
        Rotation.AboutX(-Eta0).Times(Rotation.AboutY(Xi0)).Times(Rotation.AboutZ(DeltaRa0));

    private static readonly Rotation Fk5ToIcrsMatrix = IcrsToFk5Matrix.Transposed();

    /// <summary>ICRS position → FK5 (equinox J2000) position.</summary>
    public static SkyPosition IcrsToFk5(SkyPosition icrs)
    {
        ArgumentNullException.ThrowIfNull(icrs);
        var (ra, dec) = IcrsToFk5Matrix.Apply(icrs.RightAscension, icrs.Declination);
        return new SkyPosition(ra, dec);
    }

    /// <summary>FK5 (equinox J2000) position → ICRS position.</summary>
    public static SkyPosition Fk5ToIcrs(SkyPosition fk5)
    {
        ArgumentNullException.ThrowIfNull(fk5);
        var (ra, dec) = Fk5ToIcrsMatrix.Apply(fk5.RightAscension, fk5.Declination);
        return new SkyPosition(ra, dec);
    }
}
