using System.Globalization;
using Mosaic.Wcs.Header;

namespace Mosaic.Wcs.Coordinates;

/// <summary>
/// The celestial frame of a header's sky axes, with the rotation to and from ICRS: identity for ICRS, the frame
/// bias for FK5 J2000, IAU 1976 precession to J2000 first for FK5 of another equinox, the IAU 1958 definition for
/// Galactic coordinates.
/// </summary>
public sealed record CelestialFrame
{
    private readonly Rotation _toIcrs;
    private readonly Rotation _fromIcrs;

    private CelestialFrame(CelestialFrameKind kind, double? equinox, string name, Rotation toIcrs)
    {
        Kind = kind;
        Equinox = equinox;
        Name = name;
        _toIcrs = toIcrs;
        _fromIcrs = toIcrs.Transposed();
    }

    public CelestialFrameKind Kind { get; }

    /// <summary>Julian epoch of the mean equator and equinox for FK5; null for ICRS and Galactic.</summary>
    public double? Equinox { get; }

    /// <summary>For display: "ICRS", "FK5 J2000.0", "Galactic".</summary>
    public string Name { get; }

    public static CelestialFrame Icrs { get; } = new(CelestialFrameKind.Icrs, null, "ICRS", Rotation.Identity);

    public static CelestialFrame Galactic { get; } =
        new(CelestialFrameKind.Galactic, null, "Galactic", Coordinates.Galactic.GalacticToIcrsMatrix);

    /// <summary>FK5 of the Julian epoch <paramref name="equinox"/>.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The equinox is not finite or lies outside 1000..3000, where IAU 1976 precession is no longer meant to hold.</exception>
    public static CelestialFrame Fk5(double equinox = 2000.0)
    {
        if (!(equinox is >= 1000 and <= 3000))
            throw new ArgumentOutOfRangeException(nameof(equinox), equinox, "the FK5 equinox must be a Julian epoch between 1000 and 3000");
        var bias = FrameBias.IcrsToFk5Matrix.Transposed();
        var toIcrs = equinox == 2000.0 ? bias : bias.Times(Precession.ToJ2000(equinox));
        var name = "FK5 J" + equinox.ToString("0.0###", CultureInfo.InvariantCulture);
        return new CelestialFrame(CelestialFrameKind.Fk5, equinox, name, toIcrs);
    }

    /// <summary>
    /// The frame of a header, by FITS WCS Paper I section 3.1: GLON/GLAT axes are Galactic; for RA/DEC, RADESYS
    /// names the system, else EQUINOX before 1984 means FK4 and from 1984 FK5, and neither means ICRS; FK5's
    /// equinox defaults to 2000.
    /// </summary>
    /// <exception cref="NotSupportedException">The system is FK4, FK4-NO-E, GAPPT or ecliptic.</exception>
    /// <exception cref="WcsHeaderException">RADESYS names no known system, or EQUINOX is out of range.</exception>
    public static CelestialFrame From(WcsHeader header)
    {
        ArgumentNullException.ThrowIfNull(header);
        switch (header.CType1[..4])
        {
            case "GLON": return Galactic;
            case "ELON": throw new NotSupportedException($"CTYPE{header.LongitudeAxis} '{header.CType1}': ecliptic coordinates are not supported");
        }
        var system = header.RadeSys?.ToUpperInvariant() switch
        {
            null or "" => header.Equinox is { } e ? (e < 1984.0 ? "FK4" : "FK5") : "ICRS",
            var named => named,
        };
        switch (system)
        {
            case "ICRS":
                return Icrs;
            case "FK5":
                var equinox = header.Equinox ?? 2000.0;
                if (!(equinox is >= 1000 and <= 3000))
                    throw new WcsHeaderException("EQUINOX", $"{equinox.ToString(CultureInfo.InvariantCulture)} is not a usable FK5 equinox (1000 to 3000)");
                return Fk5(equinox);
            case "FK4" or "FK4-NO-E" or "GAPPT":
                throw new NotSupportedException($"the {system} reference system is not supported (RADESYS/EQUINOX)");
            default:
                throw new WcsHeaderException("RADESYS", $"'{header.RadeSys}' is not a reference system of FITS WCS Paper I");
        }
    }

    /// <summary>ICRS position of (<paramref name="longitude"/>, <paramref name="latitude"/>) in degrees in this frame.</summary>
    public SkyPosition ToIcrs(double longitude, double latitude)
    {
        var (ra, dec) = _toIcrs.Apply(longitude, latitude);
        return new SkyPosition(ra, dec);
    }

    /// <summary>This frame's (longitude, latitude) in degrees of an ICRS position; longitude in [0, 360).</summary>
    public (double Longitude, double Latitude) FromIcrs(SkyPosition icrs)
    {
        ArgumentNullException.ThrowIfNull(icrs);
        return _fromIcrs.Apply(icrs.RightAscension, icrs.Declination);
    }

    public override string ToString() => Name;
}
