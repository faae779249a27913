namespace Mosaic.Wcs.Coordinates;

/// <summary>
/// ICRS ↔ Galactic. The IAU 1958 Galactic system is fixed in FK5 J2000 by its north pole (α, δ) =
/// (192.8594812065348°, 27.12825118085622°) and the longitude of the celestial pole 122.9319185680026°; ICRS is
/// reached through the frame bias. These are the FK5 constants astropy's Galactic frame uses.
/// </summary>
public static class Galactic
{
    private const double PoleRa = 192.8594812065348;
    private const double PoleDec = 27.12825118085622;
    private const double CelestialPoleLongitude = 122.9319185680026;

    private static readonly Rotation Fk5ToGalactic =
        Rotation.AboutZ((180.0 - CelestialPoleLongitude) * Angles.DegreesToRadians)
            .Times(Rotation.AboutY((90.0 - PoleDec) * Angles.DegreesToRadians))
            .Times(Rotation.AboutZ(PoleRa * Angles.DegreesToRadians));

    private static readonly Rotation IcrsToGalactic = Fk5ToGalactic.Times(FrameBias.IcrsToFk5Matrix);

    internal static readonly Rotation GalacticToIcrsMatrix = IcrsToGalactic.Transposed();

    /// <summary>ICRS (RA, Dec) in degrees → Galactic (l, b).</summary>
    public static GalacticPosition FromIcrs(double rightAscension, double declination) =>
        FromIcrs(new SkyPosition(rightAscension, declination));

    /// <summary>ICRS position → Galactic (l, b).</summary>
    public static GalacticPosition FromIcrs(SkyPosition icrs)
    {
        ArgumentNullException.ThrowIfNull(icrs);
        var (l, b) = IcrsToGalactic.Apply(icrs.RightAscension, icrs.Declination);
        return new GalacticPosition(l, b);
    }

    /// <summary>Galactic (l, b) in degrees → ICRS position.</summary>
    public static SkyPosition ToIcrs(double longitude, double latitude) => ToIcrs(new GalacticPosition(longitude, latitude));

    /// <summary>Galactic position → ICRS position.</summary>
    public static SkyPosition ToIcrs(GalacticPosition galactic)
    {
        ArgumentNullException.ThrowIfNull(galactic);
        var (ra, dec) = GalacticToIcrsMatrix.Apply(galactic.Longitude, galactic.Latitude);
        return new SkyPosition(ra, dec);
    }
}
